import "server-only";
import { randomUUID } from "node:crypto";
import { getPinById, insertPin } from "@/db/queries/pins";
import type { PinCreateInput, PresentedPin } from "@/lib/realtime/events";
import { runCommand } from "./command";
import { writeComment, type WrittenComment } from "./write-comment";

/**
 * Stores a pin (and its first comment when given). The id comes from the client, so a retry returns the stored pin
 * instead of a second one; `created` says whether this call wrote it. Null when the id is another project's pin.
 */
export async function createPin({
  projectId,
  authorId,
  authorName,
  input,
}: {
  projectId: string;
  authorId: string;
  authorName: string;
  input: PinCreateInput;
}): Promise<{ pin: PresentedPin; created: boolean; firstComment: WrittenComment | null } | null> {
  return runCommand(async ({ tx }) => {
    const created = await insertPin({ db: tx, projectId, authorId, input });
    // The first comment of a new pin gets a server-made id; a retried pin writes nothing (created is false).
    const firstComment = created && input.body ? await writeComment(tx, { id: randomUUID(), projectId, pinId: input.id, authorId, authorName, body: input.body, kind: "comment" }) : null;
    const pin = await getPinById({ projectId, pinId: input.id, db: tx });
    return pin ? { pin, created, firstComment } : null;
  });
}
