"use client";
import type { ReactNode } from "react";
import { useSelectedLayoutSegment } from "next/navigation";

/** Shows its children on the project's overview only (the project layout renders it on every section). */
export function OverviewOnly({ children }: { children: ReactNode }) {
  return useSelectedLayoutSegment() === null ? children : null;
}
