"use client";
// What the analysis and review say about the whole roof, beside the per-member results: the analysis warnings
// (nearly a mechanism, displacements beyond span/50), load cases in no combination, and the deflection of each
// serviceability combination against span/limit (and the project's limit now, when it has changed since: it
// follows the live "settings" event); then what is not checked, with the standing caution.
import type { InfoOverview, ReviewOverview } from "@/db/queries/revision-view";
import { NOT_CHECKED, STANDING_CAUTION } from "@/lib/review/caution";
import { DEFAULT_DEFLECTION_LIMIT } from "@/lib/projects/deflection-limit";
import { useProjectSettings } from "@/components/project/use-project-settings";

const mm = (metres: number) => (metres * 1000).toFixed(1);

function Deflections({ projectId, review }: { projectId: string; review: ReviewOverview | null | undefined }) {
  const projectLimit = useProjectSettings(projectId).data?.deflectionLimit;
  const checks = review?.deflections;
  if (!review) return null;
  if (!checks) return <p>Serviceability deflection: not stored with this revision&apos;s review (it was reviewed before the check was kept); analyse it again to see it.</p>;
  if (checks.length === 0) return <p>Serviceability deflection: no serviceability combination in the model, so none is checked.</p>;
  // reviews stored before the limit was a project setting were all made at the default
  const limit = review.deflectionLimit ?? DEFAULT_DEFLECTION_LIMIT;
  return (
    <>
      <p data-testid="roof-checks-deflection-limit">
        Serviceability deflection against span/{limit}: the project&apos;s limit when this revision was analysed (default span/{DEFAULT_DEFLECTION_LIMIT}, common practice). A change to the project&apos;s limit applies from the next analysis.
      </p>
      {projectLimit !== undefined && projectLimit !== limit ? (
        <p className="font-semibold" data-testid="roof-checks-project-limit">
          The project&apos;s limit is now span/{projectLimit}: the checks below are still against span/{limit} until the next analysis.
        </p>
      ) : null}
      <table className="mt-1 text-xs" data-testid="roof-checks-deflections">
        <thead>
          <tr className="text-left text-board-700">
            <th className="pr-3 font-normal">Serviceability combination</th>
            <th className="pr-3 text-right font-normal">Largest vertical (mm)</th>
            <th className="pr-3 text-right font-normal">Allowed (mm)</th>
            <th className="text-right font-normal">Utilisation</th>
          </tr>
        </thead>
        <tbody>
          {checks.map((c) => (
            <tr key={c.combination} data-testid={`roof-checks-deflection-${c.combination}`} className={c.utilisation > 1 ? "font-semibold text-clash" : ""}>
              <td className="pr-3">{c.combination}</td>
              <td className="pr-3 text-right font-mono tabular-nums">
                {mm(c.deflection)}
                {c.node ? ` at ${c.node}` : ""}
              </td>
              <td className="pr-3 text-right font-mono tabular-nums" title={c.steps.join("; ")}>
                {mm(c.allowed)} (span {c.span.toFixed(2)} m / {c.limit})
              </td>
              <td className="text-right font-mono tabular-nums">{c.utilisation.toFixed(3)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}

/**
 * One line above the canvas when the analysis warns (the whole panel sits below the canvas, which fills the window
 * down to the fold): a warning must be seen without scrolling.
 */
export function RoofWarningsLine({ info }: { info: InfoOverview }) {
  if (info.warnings.length === 0) return null;
  return (
    <p role="alert" className="border-b border-board-100 px-3 py-1 text-xs font-semibold text-clash" data-testid="roof-warnings-line">
      {info.warnings.length === 1 ? "1 analysis warning" : `${info.warnings.length} analysis warnings`}: {info.warnings[0]}{" "}
      <a href="#roof-checks" className="underline">
        See the checks of the whole roof below the view
      </a>
    </p>
  );
}

export function RoofChecksPanel({ projectId, info, review }: { projectId: string; info: InfoOverview; review: ReviewOverview | null | undefined }) {
  const unused = info.loadCasesInNoCombination ?? [];
  return (
    <section id="roof-checks" className="border-t border-board-100 px-3 py-2 text-xs" data-testid="roof-checks" aria-label="Checks of the whole roof">
      <h2 className="font-semibold">Checks of the whole roof</h2>
      {info.warnings.length > 0 ? (
        <ul className="list-disc pl-5 font-semibold text-clash" data-testid="roof-checks-warnings">
          {info.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : (
        <p data-testid="roof-checks-warnings">No analysis warning: no joint is nearly a mechanism and no displacement exceeds span/50.</p>
      )}
      {unused.length > 0 ? (
        <p data-testid="roof-checks-unused-cases">
          Load cases in no combination: {unused.join(", ")}. They are analysed and count for &quot;zero in every result&quot;, but not for the design envelope, which is over the combinations.
        </p>
      ) : null}
      <Deflections projectId={projectId} review={review} />
      <p className="mt-1 text-board-700" data-testid="roof-checks-not-checked">
        {NOT_CHECKED} {STANDING_CAUTION}
      </p>
    </section>
  );
}
