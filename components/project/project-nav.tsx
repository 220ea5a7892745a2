"use client";
import Link from "next/link";
import { useSelectedLayoutSegment } from "next/navigation";

/**
 * The project's sections, shown by the project layout. Each area of the product adds its entry here (one line
 * each): the overview with the team is the foundation's; models and viewer, clashes, review sessions and the report
 * belong to their areas; the captured-mail tab appears for owners while local mail capture is on.
 */
export const PROJECT_SECTIONS = [
  { segment: "", label: "Overview" },
  { segment: "models", label: "Models" },
  { segment: "viewer", label: "3D viewer" },
  { segment: "clashes", label: "Clashes" },
  { segment: "sessions", label: "Review sessions" },
  { segment: "report", label: "Report" },
  { segment: "mail", label: "Mail" },
] as const;

export type ProjectSection = (typeof PROJECT_SECTIONS)[number]["segment"];

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
