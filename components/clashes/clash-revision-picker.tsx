"use client";

import { useRouter } from "next/navigation";

/** Chooses which revision's clashes are shown (?revision=N); the newest by default. */
export function ClashRevisionPicker({ projectId, revisions, current }: { projectId: string; revisions: { number: number; name: string }[]; current: number }) {
  const router = useRouter();
  return (
    <label className="flex items-center gap-2 text-sm">
      Revision
      <select className="rounded border border-board-200 bg-white px-2 py-1" value={current} data-testid="clash-revision" onChange={(e) => router.push(`/projects/${projectId}/clashes?revision=${e.target.value}`)}>
        {revisions.map((r) => (
          <option key={r.number} value={r.number}>
            {r.number}: {r.name}
          </option>
        ))}
      </select>
    </label>
  );
}
