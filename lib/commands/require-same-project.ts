// Issue 11 hole 11 / issue 21 item 4: every id a write links to must belong to the project in the URL or the
// connection. One helper, called by every write that stores a link (uploads, pins).
import type { Executor } from "@/db/client";
import { linksOutsideProject, type Links } from "@/db/queries/ownership";
import { ValidationError } from "@/lib/http/errors";

const what: Record<keyof Links, string> = { revisionId: "revision", runId: "run", commentId: "comment", pinId: "pin" };

/** Throws a 400 naming each link that is not a row of this project (another project's, or none at all). */
export async function requireSameProject(projectId: string, links: Links, db?: Executor): Promise<void> {
  const outside = await linksOutsideProject({ projectId, links, db });
  if (outside.length) {
    throw new ValidationError(
      outside.map((key) => ({ path: key, message: `No ${what[key]} of this project has that id.` })),
      "A linked item is not part of this project.",
    );
  }
}
