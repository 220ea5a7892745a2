"use client";

import { useRouter } from "next/navigation";
import { RevisionSelect, type RevisionOption } from "./revision-select";

/** Chooses which revision a project page shows by navigating to `/projects/<id>/<page>?revision=N`. */
export function RevisionPicker({ projectId, page, revisions, current, testId }: { projectId: string; page: "viewer" | "clashes" | "report"; revisions: RevisionOption[]; current: number; testId: string }) {
  const router = useRouter();
  return (
    <RevisionSelect
      revisions={revisions}
      labelClassName="flex items-center gap-2 text-sm"
      className="rounded border border-board-200 bg-white px-2 py-1"
      value={current}
      data-testid={testId}
      onChange={(e) => router.push(`/projects/${projectId}/${page}?revision=${e.target.value}`)}
    />
  );
}
