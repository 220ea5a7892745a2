import "server-only";
// Route-side reading (a private folder of the project API): it reads stored rows, so it is not lib/.
import { getRevisionForMep } from "@/db/queries/mep";
import { NotFoundError } from "@/lib/http/errors";

/** The revision a runs/clashes request names, or a 404. */
export async function requireRevision(projectId: string, number: number) {
  const revision = await getRevisionForMep({ projectId, number });
  if (!revision) throw new NotFoundError("No such model revision on this project.");
  return revision;
}
