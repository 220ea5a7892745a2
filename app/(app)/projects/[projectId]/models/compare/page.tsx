import type { Metadata } from "next";
import Link from "next/link";
import { RevisionComparisonView } from "@/components/models/revision-comparison";
import { RevisionStageBadge } from "@/components/revision/revision-stage-badge";
import { listRevisionsByProject } from "@/db/queries/models";
import { requirePageProject } from "@/lib/auth/page";
import { loadRevisionComparison } from "@/lib/commands/revision-comparison";
import { compareQuerySchema } from "@/lib/models/schemas";
import { defaultRevision } from "@/lib/models/revision-stage";

export const metadata: Metadata = { title: "Compare revisions" };

/**
 * Two revisions side by side (issue 16): ?to= defaults to the current revision, ?from= to the one before it. The
 * pickers are a plain GET form, so the page works without scripts and every comparison has its own address.
 */
export default async function CompareRevisionsPage({ params, searchParams }: PageProps<"/projects/[projectId]/models/compare">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId);
  const revisions = await listRevisionsByProject({ projectId });
  const asked = await searchParams;
  const to = revisions.find((r) => r.number === Number(asked.to)) ?? defaultRevision(revisions);
  const from = revisions.find((r) => r.number === Number(asked.from)) ?? revisions.find((r) => to && r.number < to.number) ?? revisions.find((r) => r !== to);
  const parsed = from && to ? compareQuerySchema.safeParse({ from: from.number, to: to.number }) : null;
  const comparison = parsed?.success ? await loadRevisionComparison({ projectId, ...parsed.data }) : null;
  const picker = (name: "from" | "to", chosen: number | undefined) => (
    <label className="flex flex-col text-sm font-medium text-board-800">
      {name === "from" ? "Compare revision" : "with revision"}
      <select name={name} defaultValue={chosen} className="mt-1 rounded-md border border-board-200 bg-white px-2 py-1.5 font-normal" data-testid={`compare-${name}`}>
        {revisions.map((r) => (
          <option key={r.id} value={r.number}>
            {r.number} · {r.name} · {r.isCurrent ? "current" : r.analysisStatus === "unstable" ? "unstable" : "draft"}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <div className="flex flex-col gap-6">
      <section className="flex flex-col gap-4" data-testid="compare-page">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-lg font-semibold">Compare revisions</h2>
          <Link className="text-sm underline" href={`/projects/${project.id}/models`}>
            Back to the revisions
          </Link>
        </div>
        {revisions.length < 2 ? (
          <p className="text-board-700" data-testid="compare-empty">
            This project has {revisions.length === 0 ? "no revision" : "one revision"} yet; a comparison needs two.
          </p>
        ) : (
          <form className="flex flex-wrap items-end gap-3" method="get" data-testid="compare-form">
            {picker("from", from?.number)}
            {picker("to", to?.number)}
            <button type="submit" className="rounded-md bg-board-800 px-3 py-1.5 text-sm font-medium text-white">
              Compare
            </button>
            {from && to ? (
              <p className="flex items-center gap-2 text-sm text-board-700">
                <RevisionStageBadge revision={from} /> → <RevisionStageBadge revision={to} />
              </p>
            ) : null}
          </form>
        )}
        {parsed && !parsed.success ? (
          <p role="alert" className="text-sm text-clash">
            {parsed.error.issues[0].message}
          </p>
        ) : null}
        {comparison ? <RevisionComparisonView projectId={project.id} comparison={comparison} /> : null}
      </section>
    </div>
  );
}
