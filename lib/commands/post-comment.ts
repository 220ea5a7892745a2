import "server-only";
import { lockPinInProject } from "@/db/queries/pins";
import { isRecordStep } from "@/lib/realtime/thread-record";
import { runCommand } from "./command";
import { writeComment, type CommentInput, type WrittenComment } from "./write-comment";

/**
 * Posts a comment, or a step of the thread's record, on a pin of the project (see writeComment); the pin is locked
 * first so two steps on one thread are judged one after the other (plain comments wait for a step, not for each
 * other). Null when the pin is not in the project.
 */
export async function postComment(input: CommentInput): Promise<WrittenComment | null> {
  return runCommand(async ({ tx }) => {
    if (!(await lockPinInProject({ db: tx, projectId: input.projectId, pinId: input.pinId, exclusive: isRecordStep(input.kind) }))) return null;
    return writeComment(tx, input);
  });
}
