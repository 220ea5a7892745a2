import type { ComponentProps } from "react";

export type RevisionOption = { number: number; name: string; isCurrent?: boolean; analysisStatus?: "ok" | "unstable" | null };

/**
 * A labelled <select> of a project's revisions ("3: Tender issue"), shared by the viewer, clashes and report
 * pages. Everything else (value or defaultValue, name, onChange, classes, test id) goes to the <select>.
 */
export function RevisionSelect({ revisions, labelClassName, ...select }: { revisions: RevisionOption[]; labelClassName: string } & ComponentProps<"select">) {
  return (
    <label className={labelClassName}>
      Revision
      <select {...select}>
        {revisions.map((r) => (
          <option key={r.number} value={r.number}>
            {r.number}: {r.name}
            {r.analysisStatus === "unstable" ? " (unstable)" : r.isCurrent ? " (current)" : r.isCurrent === false ? " (draft)" : ""}
          </option>
        ))}
      </select>
    </label>
  );
}
