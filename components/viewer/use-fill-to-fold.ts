"use client";
// The height that makes the viewer's stage end at the bottom of the window when the page is scrolled to the top
// (issue 17 item 9: the canvas fills the space above the fold). The bars above it differ by page, role and width
// (the toolbar may wrap, a stability or job panel may appear), so no fixed CSS offset fits; the height is measured
// from the stage's place on the page instead, again whenever the page or the window changes size.
import { useLayoutEffect, useState } from "react";
import { viewerStage } from "./config";

/** The stage's height in px for `stage` (null until it is rendered: a callback ref's element, and before measuring). */
export function useFillToFold(stage: HTMLElement | null): number | null {
  const [height, setHeight] = useState<number | null>(null);
  useLayoutEffect(() => {
    if (!stage) return;
    // Setting the same height again renders nothing, so the observer that hears our own change settles at once.
    const fit = () => {
      const top = stage.getBoundingClientRect().top + window.scrollY;
      setHeight(Math.max(viewerStage.minHeight, Math.floor(window.innerHeight - top - viewerStage.bottomGap)));
    };
    fit();
    const observer = new ResizeObserver(fit);
    observer.observe(document.body);
    window.addEventListener("resize", fit);
    return () => {
      observer.disconnect();
      window.removeEventListener("resize", fit);
    };
  }, [stage]);
  return height;
}
