import Link from "next/link";
import type { ReviewState } from "@/db/queries/review-state";
import { CLASH_OUTCOME_LABELS } from "@/lib/clash/outcomes";

const dateTime = (iso: string) => new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" }) + " UTC";

/** Where the project's review stands: threads by state, the revision under review, its clashes, the last session. */
export function ReviewStatePanel({ projectId, state }: { projectId: string; state: ReviewState }) {
  const { threads, revision, clashes, lastSession } = state;
  const undecided = clashes.byOutcome.find((row) => row.outcome === null)?.count ?? 0;
  return (
    <section className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-5" aria-labelledby="review-state-heading" data-testid="review-state">
      <h2 id="review-state-heading" className="text-lg font-semibold">
        Where the review stands
      </h2>
      <dl className="grid gap-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
        <div>
          <dt className="font-medium text-board-800">Revision under review</dt>
          <dd data-testid="review-state-revision">
            {revision ? (
              <Link className="underline" href={`/projects/${projectId}/viewer?revision=${revision.number}`}>
                Revision {revision.number}: {revision.name}
              </Link>
            ) : (
              "No revision yet: generate or upload a roof on the Models tab."
            )}
            {revision ? <span className="block text-xs text-board-700">{revision.isCurrent ? "marked current" : "newest (none marked current yet)"}</span> : null}
          </dd>
        </div>
        <div>
          <dt className="font-medium text-board-800">Questions</dt>
          <dd data-testid="review-state-threads">
            {threads.open} open · {threads.answered} answered · {threads.closed} closed
          </dd>
        </div>
        <div>
          <dt className="font-medium text-board-800">Clashes on this revision</dt>
          <dd data-testid="review-state-clashes">
            {clashes.total === 0 ? (
              "None found."
            ) : (
              <ul>
                <li>{undecided} without a proposal</li>
                {clashes.byOutcome
                  .filter((row) => row.outcome !== null)
                  .map((row) => (
                    <li key={row.outcome}>
                      {row.count} {CLASH_OUTCOME_LABELS[row.outcome!].toLowerCase()}
                    </li>
                  ))}
                {clashes.needsAnotherLook > 0 ? <li className="font-medium text-compression">{clashes.needsAnotherLook} need another look</li> : null}
              </ul>
            )}
          </dd>
        </div>
        <div>
          <dt className="font-medium text-board-800">Last review session</dt>
          <dd data-testid="review-state-session">
            {lastSession
              ? `${lastSession.endedAt ? "Held" : "Live now"}, presented by ${lastSession.presenterName}, ${lastSession.endedAt ? dateTime(lastSession.endedAt) : `since ${dateTime(lastSession.startedAt)}`}`
              : "None yet."}
          </dd>
        </div>
      </dl>
    </section>
  );
}
