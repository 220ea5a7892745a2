import { RevisionPicker } from "@/components/revision/revision-picker";
import type { RevisionOption } from "@/components/revision/revision-select";

/** Chooses which revision's clashes are shown (?revision=N); the current one by default. */
export function ClashRevisionPicker(props: { projectId: string; revisions: RevisionOption[]; current: number }) {
  return <RevisionPicker {...props} page="clashes" testId="clash-revision" />;
}
