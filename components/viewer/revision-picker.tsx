"use client";

import { useRouter } from "next/navigation";

/** Chooses which revision the viewer shows (?revision=N); the newest is shown by default. */
export function RevisionPicker({ projectId, revisions, current }: { projectId: string; revisions: { number: number; name: string }[]; current: number }) {
  const router = useRouter();
  return (
    <label className="flex items-center gap-2 text-sm">
      Revision
      <select
        className="rounded border border-board-200 bg-white px-2 py-1"
        value={current}
        data-testid="viewer-revision"
        onChange={(e) => router.push(`/projects/${projectId}/viewer?revision=${e.target.value}`)}
      >
        {revisions.map((r) => (
          <option key={r.number} value={r.number}>
            {r.number}: {r.name}
          </option>
        ))}
      </select>
    </label>
  );
}
