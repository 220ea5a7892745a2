import { RevisionPicker as ProjectRevisionPicker } from "@/components/revision/revision-picker";
import type { RevisionOption } from "@/components/revision/revision-select";

/** Chooses which revision the viewer shows (?revision=N); the newest is shown by default. */
export function RevisionPicker(props: { projectId: string; revisions: RevisionOption[]; current: number }) {
  return <ProjectRevisionPicker {...props} page="viewer" testId="viewer-revision" />;
}
