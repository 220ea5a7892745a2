import "server-only";
import { pinInProject } from "@/db/queries/pins";
import type { CommentKind } from "@/lib/realtime/events";
import { runCommand } from "./command";
import { writeComment, type WrittenComment } from "./write-comment";

/** Posts a comment on a pin of the project (see writeComment); null when the pin is not in the project. */
export async function postComment(input: { id: string; projectId: string; pinId: string; authorId: string; authorName: string; body: string; kind: CommentKind }): Promise<WrittenComment | null> {
  return runCommand(async ({ tx }) => {
    if (!(await pinInProject({ db: tx, projectId: input.projectId, pinId: input.pinId }))) return null;
    return writeComment(tx, input);
  });
}
