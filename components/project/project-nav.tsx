"use client";
import Link from "next/link";
import { useSelectedLayoutSegment } from "next/navigation";
import { PROJECT_SECTIONS, type ProjectSection } from "./project-sections";

/** The section tabs of a project (shown by the project layout); the current one from the layout segment. */
export function ProjectNav({ projectId, sections }: { projectId: string; sections: readonly ProjectSection[] }) {
  const current = useSelectedLayoutSegment() ?? "";
  return (
    <nav aria-label="Project sections" className="flex flex-wrap gap-1 border-b border-board-200" data-testid="project-nav">
      {PROJECT_SECTIONS.filter(({ segment }) => sections.includes(segment)).map(({ segment, label }) => {
        const active = segment === current;
        return (
          <Link
            key={label}
            href={`/projects/${projectId}${segment ? `/${segment}` : ""}`}
            aria-current={active ? "page" : undefined}
            className={`-mb-px border-b-2 px-3 py-2 text-sm ${active ? "border-tension font-medium text-board-900" : "border-transparent text-board-700 hover:text-board-900"}`}
          >
            {label}
          </Link>
        );
      })}
    </nav>
  );
}
