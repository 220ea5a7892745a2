"use client";
// "Under any roof load" in the member panel: whether any load at a loadable node could make the member work (stored
// with the review), where most, and, beside an "idle" verdict, the load patterns that verdict rests on.
import type { ReviewOverview } from "@/db/queries/revision-view";
import type { StoredMemberReview } from "@/lib/models/analyse";
import { analysedPatterns, idlePatternsText } from "@/lib/review/analysed-patterns";

const perKn = (value: number) => `${value > 0 ? "+" : "−"}${Math.abs(value).toPrecision(3)} kN per kN`;

/** `member` is the member's review row (from its detail), `review` the revision's review without rows. */
export function AnyLoadSection({ member, review }: { member: StoredMemberReview; review: ReviewOverview }) {
  const row = member.anyLoad;
  const run = review.anyLoad;
  const idleVerdict = member.verdict === "idle";
  const patterns = idleVerdict ? (
    <p className="mb-1" data-testid="member-panel-patterns">
      {idlePatternsText(analysedPatterns(review))}
    </p>
  ) : null;
  if (!run && review.wholeRoofChecksLeftOut) {
    return (
      <section className="mb-3 text-xs" data-testid="member-panel-any-load">
        {patterns}
        <h3 className="mb-1 font-semibold">Under any roof load</h3>
        <p>Not checked: {review.wholeRoofChecksLeftOut}</p>
      </section>
    );
  }
  if (!row || !run) return patterns ? <section className="mb-3 text-xs">{patterns}</section> : null;
  return (
    <section className="mb-3 text-xs" data-testid="member-panel-any-load">
      {patterns}
      <h3 className="mb-1 font-semibold">Under any roof load</h3>
      {row.idle ? (
        <p data-testid="any-load-verdict">
          Idle for any roof load: no load at any of the {run.loadable.nodes} {run.loadable.which === "top layer" ? "top-layer" : "loadable"} nodes, along{" "}
          {run.loadable.directions.join(", ")}, makes it work.
        </p>
      ) : (
        <p data-testid="any-load-verdict" className={idleVerdict ? "font-semibold text-clash" : ""}>
          {idleVerdict ? "Works under some roof load not analysed: " : "Works under roof load; most at "}
          {row.mattersMost.map((p) => `${p.node} (+${p.direction}: ${perKn(p.value)})`).join(", ")}.
        </p>
      )}
      <details className="mt-1 text-board-700">
        <summary>Tolerance</summary>
        {run.tolerance}
      </details>
    </section>
  );
}
