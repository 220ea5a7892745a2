"use client";
// "Hang the services" (structural engineer): the runs' weight becomes the hung-services load case of a new,
// analysed revision, so the team sees which zero-force members start carrying load.
import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { Button, FormMessage } from "@/components/ui/form";
import { apiFetch } from "@/lib/http/fetcher";

interface HangAnswer {
  revision: { number: number; status: "ok" | "unstable" };
  totalLoad: number;
  hangers: number;
  zeroForce: { noLongerZero: string[]; newlyZero: string[] } | null;
  detection: { found: number };
}

export function HangServicesButton({ projectId, revision }: { projectId: string; revision: number }) {
  const [spacing, setSpacing] = useState("2.5");
  const hang = useMutation({
    mutationFn: () => apiFetch<HangAnswer>(`/api/projects/${projectId}/services`, { method: "POST", body: { revision, hangerSpacing: Number(spacing) } }),
  });
  const answer = hang.data;
  return (
    <div className="flex flex-col gap-2" data-testid="hang-services">
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col text-sm font-medium text-board-800">
          Hanger spacing (m)
          <input type="number" min={0.5} max={12} step={0.5} value={spacing} onChange={(e) => setSpacing(e.target.value)} className="mt-1 w-24 rounded-md border border-board-200 px-2 py-1.5 font-normal" />
        </label>
        <Button type="button" onClick={() => hang.mutate()} disabled={hang.isPending} data-testid="hang-services-submit">
          {hang.isPending ? "Hanging and analysing…" : "Hang the services"}
        </Button>
      </div>
      <FormMessage message={hang.error?.message} />
      {answer && (
        <div className="rounded-md border border-tension/30 bg-tension/5 p-2 text-sm" role="status" data-testid="hang-services-done">
          Revision {answer.revision.number} created ({answer.revision.status === "ok" ? "analysed" : "unstable"}): {answer.totalLoad.toFixed(2)} kN on {answer.hangers} hangers.{" "}
          {answer.zeroForce &&
            `${answer.zeroForce.noLongerZero.length} member(s) zero in all combinations before now carry force; ${answer.zeroForce.newlyZero.length} became zero. `}
          <Link className="text-tension underline" href={`/projects/${projectId}/clashes?revision=${answer.revision.number}`}>
            Open its clashes
          </Link>{" "}
          ·{" "}
          <Link className="text-tension underline" href={`/projects/${projectId}/viewer?revision=${answer.revision.number}`}>
            View it in 3D
          </Link>
        </div>
      )}
    </div>
  );
}
