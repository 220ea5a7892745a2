import "server-only";
// Route-side reading (a private folder of the project API): it reads stored rows, so it is not lib/.
import { getRevisionForMep, getRevisionRef } from "@/db/queries/mep";
import { NotFoundError } from "@/lib/http/errors";

const noSuchRevision = () => new NotFoundError("No such model revision on this project.");

/** The revision a runs/clashes write names, with its model (clash detection reads it), or a 404. */
export async function requireRevision(projectId: string, number: number) {
  const revision = await getRevisionForMep({ projectId, number });
  if (!revision) throw noSuchRevision();
  return revision;
}

/**
 * The revision a runs/clashes read names, its id and number only, or a 404. Reads must not load the model: it is
 * megabytes on a big roof, and the viewer asks for the runs and clashes of every revision it opens (issue 13).
 */
export async function requireRevisionRef(projectId: string, number: number) {
  const revision = await getRevisionRef({ projectId, number });
  if (!revision) throw noSuchRevision();
  return revision;
}
