"use client";
// The member panel's "Influence map" button: asks the what-if worker for the member's force per 1 kN downward at
// every top-layer node and hands the answer to the viewer store, which the influence layer and legend draw from.
import { useMutation } from "@tanstack/react-query";
import type { InfluenceMap } from "@/lib/review/influence";
import { formatInfluence } from "./influence-colours";
import type { WhatIfAnswer, WhatIfRequest } from "./whatif-protocol";
import { useViewerStore } from "./viewer-store";

export function InfluenceControl({ memberId, ask, ready }: { memberId: string; ask: (request: WhatIfRequest) => Promise<WhatIfAnswer>; ready: boolean }) {
  const shown = useViewerStore((s) => (s.influence?.member === memberId ? s.influence : null));
  const compute = useMutation({
    mutationFn: () => ask({ kind: "influence", member: memberId }) as Promise<InfluenceMap>,
    onSuccess: (map) => useViewerStore.getState().showInfluence(map),
  });
  return (
    <section className="mb-3 border-t border-board-100 pt-2" data-testid="member-panel-influence">
      <h3 className="mb-1 font-semibold">Where would added load make it work?</h3>
      <div className="flex gap-2">
        <button
          type="button"
          className="rounded border border-board-200 px-2 py-1 text-xs hover:bg-board-100 disabled:opacity-60"
          disabled={!ready || compute.isPending}
          onClick={() => compute.mutate()}
          data-testid="influence-map"
        >
          {!ready ? "Starting the what-if engine…" : compute.isPending ? "Computing the influence map…" : "Influence map"}
        </button>
        {shown ? (
          <button type="button" className="rounded border border-board-200 px-2 py-1 text-xs hover:bg-board-100" onClick={() => useViewerStore.getState().showInfluence(null)}>
            Clear
          </button>
        ) : null}
      </div>
      {compute.isError ? (
        <p role="alert" className="mt-1 text-xs text-clash" data-testid="influence-error">
          The influence map could not be computed: {compute.error.message}
        </p>
      ) : null}
      {shown ? (
        <p className="mt-1 text-xs" data-testid="influence-summary">
          Largest tension per kN: {shown.largestTension ? `${formatInfluence(shown.largestTension.value)} at ${shown.largestTension.node}` : "none"}; largest compression per kN:{" "}
          {shown.largestCompression ? `${formatInfluence(shown.largestCompression.value)} at ${shown.largestCompression.node}` : "none"}.
        </p>
      ) : null}
    </section>
  );
}
