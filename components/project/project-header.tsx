import type { ProjectForMember } from "@/lib/projects/for-member";
import { OverviewOnly } from "./overview-only";
import { RoleBadge } from "./role-badge";

const STANDARD_LABELS: Record<string, string> = {
  "AISC360-22": "AISC 360-22",
  "EN1993-1-1": "EN 1993-1-1",
  "ASCE7-22": "ASCE 7-22",
  EN1990: "EN 1990",
};

/**
 * The project's name, organisation, standards and the caller's role: shared by every project page. The description
 * is read on the overview; the working pages (viewer, clashes…) leave its lines to the work (issue 17 item 9).
 */
export function ProjectHeader({ project }: { project: ProjectForMember }) {
  return (
    <header className="flex flex-col gap-2" data-testid="project-header">
      <span className="text-xs uppercase tracking-wide text-board-700">{project.organization.name}</span>
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">{project.name}</h1>
        <RoleBadge role={project.role} />
      </div>
      {project.description ? (
        <OverviewOnly>
          <p className="max-w-3xl text-board-700">{project.description}</p>
        </OverviewOnly>
      ) : null}
      <p className="text-sm text-board-700">
        Member checks to <strong>{STANDARD_LABELS[project.designStandard]}</strong>, load combinations to{" "}
        <strong>{STANDARD_LABELS[project.combinationStandard]}</strong>
      </p>
    </header>
  );
}
