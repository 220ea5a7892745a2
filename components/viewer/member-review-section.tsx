"use client";
// The review half of the member panel: verdict, utilisation with its arithmetic, why-zero, and the removal and
// opening what-ifs (answered by the Web Worker), each with the standing caution.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import type { MemberDetail } from "@/lib/models/member-detail";
import { NOT_CHECKED, STANDING_CAUTION } from "@/lib/review/caution";
import type { OpeningAssessment, OpeningSpec } from "@/lib/review/opening";
import type { RemovalOutcome } from "@/lib/review/removal";
import type { WhyZero } from "@/lib/review/why-zero";
import { AnyLoadSection } from "./any-load-section";
import type { PreparedModel } from "./prepare";
import type { ViewedRevision } from "./viewed-revision";
import type { WhatIfAnswer, WhatIfRequest } from "./whatif-protocol";
import { useViewerStore } from "./viewer-store";

type Ask = (request: WhatIfRequest) => Promise<WhatIfAnswer>;

function Caution() {
  return (
    <p className="mt-2 rounded border border-compression/30 bg-compression/5 p-2 text-xs text-board-800" data-testid="standing-caution">
      {STANDING_CAUTION} {NOT_CHECKED}
    </p>
  );
}

function MechanismDrawButtons({ outcome, nodeIds }: { outcome: Extract<RemovalOutcome, { mechanism: true }>; nodeIds: readonly string[] }) {
  const shown = useViewerStore((s) => s.mode?.label ?? null);
  return (
    <div className="flex flex-wrap gap-1">
      {outcome.modes.map((mode, k) => {
        // the removal leaves every node in place, so the mode is in the revision's node order
        const label = `Mechanism ${k + 1} without ${outcome.removed.join(", ")}`;
        const drawn = shown === label;
        return (
          <button
            key={label}
            type="button"
            className="rounded border border-board-200 px-2 py-1 hover:bg-board-100"
            onClick={() => useViewerStore.getState().showMode(drawn ? null : { label, nodeIds, shape: mode.shape })}
            data-testid={`removal-draw-mechanism-${k + 1}`}
          >
            {drawn ? `Clear mechanism ${k + 1}` : `Draw mechanism ${k + 1}`}
          </button>
        );
      })}
    </div>
  );
}

function RemovalResult({ outcome, nodeIds }: { outcome: RemovalOutcome; nodeIds: readonly string[] }) {
  if (outcome.mechanism) {
    return (
      <div data-testid="removal-result" className="text-xs">
        <p className="font-semibold text-clash">Without it the roof becomes a mechanism.</p>
        <ul className="list-disc pl-5">{outcome.instabilityText.map((t) => <li key={t}>{t}</li>)}</ul>
        <MechanismDrawButtons outcome={outcome} nodeIds={nodeIds} />
      </div>
    );
  }
  const worst = [...outcome.changes].sort((a, b) => b.changedCount - a.changedCount)[0];
  return (
    <div data-testid="removal-result" className="space-y-1 text-xs">
      <p>
        Largest utilisation {outcome.utilisation.maxBefore.toFixed(2)} → <strong>{outcome.utilisation.maxAfter.toFixed(2)}</strong>
        {outcome.utilisation.overCapacity.length > 0 ? <span className="text-clash"> · over capacity: {outcome.utilisation.overCapacity.slice(0, 8).join(", ")}</span> : null}
      </p>
      {worst ? <p>{worst.changedCount} members change force in {worst.result}; {worst.newlyZero.length} become zero-force, {worst.noLongerZero.length} start carrying force.</p> : null}
      {outcome.lostBraces.length > 0 ? (
        <p>
          Loses bracing of{" "}
          {outcome.lostBraces
            .map((b) => {
              const held = b.restraints.map((r) => `${r.joint} along (${r.direction.map((v) => v.toFixed(2)).join(", ")}): ${r.stiffnessAfter.toPrecision(3)} of ${r.required.toPrecision(3)} kN/m needed`).join("; ");
              return `${b.member} (${held}; u = ${b.utilisationWithoutBrace.toFixed(2)} with doubled buckling length)`;
            })
            .join(", ")}
          .
        </p>
      ) : null}
    </div>
  );
}

function OpeningResult({ assessment }: { assessment: OpeningAssessment }) {
  return (
    <div data-testid="opening-result" className="space-y-1 text-xs">
      <p>
        <strong>{assessment.verdict}</strong> · net area {assessment.netArea > 0 ? `${(assessment.netArea * 1e6).toFixed(0)} mm²` : "—"} ({assessment.areaLossPercent.toFixed(1)} % lost)
      </p>
      {assessment.governing ? (
        <p>
          Governing {assessment.governing.combination}: utilisation {assessment.governing.utilisationWithout.toFixed(2)} → {assessment.governing.utilisationWith.toFixed(2)}
        </p>
      ) : null}
      <ul className="list-disc pl-5">{assessment.reasons.map((r) => <li key={r}>{r}</li>)}</ul>
      <details>
        <summary>Not checked</summary>
        <ul className="list-disc pl-5">{assessment.notChecked.map((r) => <li key={r}>{r}</li>)}</ul>
      </details>
    </div>
  );
}

export function MemberReviewSection({ memberId, detail, revision, prepared, ask, ready }: { memberId: string; detail: MemberDetail | undefined; revision: ViewedRevision; prepared: PreparedModel; ask: Ask; ready: boolean }) {
  const resultId = useViewerStore((s) => s.resultId);
  const [removalAsked, setRemovalAsked] = useState<string | null>(null);
  const [opening, setOpening] = useState<{ member: string; spec: OpeningSpec } | null>(null);
  const [diameter, setDiameter] = useState(50);
  const review = detail?.review ?? undefined;
  const isZero = resultId ? (detail?.results[resultId]?.zero ?? false) : false;
  const base = ["whatif", revision.id, memberId] as const;

  const whyZero = useQuery({
    queryKey: [...base, "whyZero", resultId],
    queryFn: () => ask({ kind: "whyZero", member: memberId, resultId: resultId! }) as Promise<WhyZero | null>,
    enabled: ready && isZero && resultId !== null,
    staleTime: Infinity,
  });
  const removal = useQuery({
    queryKey: [...base, "removal"],
    queryFn: () => ask({ kind: "removal", member: memberId }) as Promise<RemovalOutcome>,
    enabled: ready && removalAsked === memberId,
    staleTime: Infinity,
  });
  const openingQuery = useQuery({
    queryKey: [...base, "opening", opening?.spec],
    queryFn: () => ask({ kind: "opening", member: memberId, opening: opening!.spec }) as Promise<OpeningAssessment>,
    enabled: ready && opening?.member === memberId,
    staleTime: Infinity,
  });
  return (
    <>
      {review ? (
        <section className="mb-3" data-testid="member-panel-review">
          <h3 className="mb-1 font-semibold">
            Verdict: <span data-testid="member-panel-verdict">{review.verdict}</span>
          </h3>
          <p className="text-xs">{review.reason}</p>
          {revision.analysis?.review ? <AnyLoadSection member={review} review={revision.analysis.review} /> : null}
          <h3 className="mb-1 mt-3 font-semibold">
            Utilisation ({detail?.standard}):{" "}
            <span data-testid="member-panel-utilisation" className={review.utilisation !== null && review.utilisation > 1 ? "text-clash" : ""}>
              {review.utilisation === null ? "no force, nothing to check" : review.utilisation.toFixed(3)}
            </span>
          </h3>
          {review.governing ? (
            <details className="text-xs" open>
              <summary>
                {review.governing.mode} in {review.governing.result}: N = {review.governing.force.toFixed(2)} kN, resistance {review.governing.resistance.toFixed(2)} kN ({review.governing.clause})
              </summary>
              <table className="mt-1 w-full">
                <tbody>
                  {review.governing.steps.map((step, k) => (
                    <tr key={k} className="align-top">
                      <td className="pr-2">{step.label}</td>
                      <td className="pr-2 font-mono text-board-700">{step.expression ?? ""}</td>
                      <td className="whitespace-nowrap text-right font-mono">
                        {typeof step.value === "number" ? step.value.toPrecision(4) : step.value} {step.unit}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </details>
          ) : null}
          {review.warnings.length > 0 ? <ul className="mt-1 list-disc pl-5 text-xs text-compression">{review.warnings.map((w) => <li key={w}>{w}</li>)}</ul> : null}
        </section>
      ) : null}

      {isZero ? (
        <section className="mb-3" data-testid="member-panel-why-zero">
          <h3 className="mb-1 font-semibold">Why is it zero here?</h3>
          <p className="text-xs">{whyZero.isPending ? "Working it out…" : whyZero.isError ? whyZero.error.message : (whyZero.data?.explanation ?? "No explanation found.")}</p>
        </section>
      ) : null}

      <section className="mb-3 border-t border-board-100 pt-2">
        <h3 className="mb-1 font-semibold">What if…</h3>
        <button type="button" className="rounded border border-board-200 px-2 py-1 text-xs hover:bg-board-100" disabled={!ready} onClick={() => setRemovalAsked(memberId)} data-testid="whatif-remove">
          {ready ? "…it were removed?" : "Starting the what-if engine…"}
        </button>
        {removalAsked === memberId ? (
          removal.isPending ? <p className="text-xs">Re-analysing without it…</p> : removal.isError ? <p className="text-xs text-clash">{removal.error.message}</p> : removal.data ? <RemovalResult outcome={removal.data} nodeIds={prepared.nodes.ids} /> : null
        ) : null}
        <form
          className="mt-2 flex items-end gap-2 text-xs"
          onSubmit={(e) => {
            e.preventDefault();
            const position = Number(new FormData(e.currentTarget).get("position"));
            setOpening({ member: memberId, spec: { shape: "round", diameter: diameter / 1000, position } });
          }}
        >
          <label className="flex flex-col">
            Round hole Ø (mm)
            <input className="w-20 rounded border border-board-200 px-1" type="number" min={1} value={diameter} onChange={(e) => setDiameter(Number(e.target.value))} />
          </label>
          <label className="flex flex-col">
            at (m from {detail?.member.i})
            <input name="position" className="w-20 rounded border border-board-200 px-1" type="number" min={0} step="any" defaultValue={0.5} />
          </label>
          <button type="submit" disabled={!ready} className="rounded border border-board-200 px-2 py-1 hover:bg-board-100" data-testid="whatif-opening">
            …an opening were cut?
          </button>
        </form>
        {opening?.member === memberId ? (
          openingQuery.isPending ? <p className="text-xs">Checking the net section…</p> : openingQuery.isError ? <p className="text-xs text-clash">{openingQuery.error.message}</p> : openingQuery.data ? <OpeningResult assessment={openingQuery.data} /> : null
        ) : null}
        <Caution />
      </section>
    </>
  );
}
