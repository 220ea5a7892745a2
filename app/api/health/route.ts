import { pingDatabase } from "@/db/queries/health";
import { checkHealth } from "@/lib/health";
import { publicRoute } from "@/lib/http/route";

/** The web process is up and reaches PostgreSQL (200), or says what is wrong (503). */
export const GET = publicRoute({}, async () => {
  const { status, body } = await checkHealth("web", pingDatabase);
  return Response.json(body, { status, headers: { "cache-control": "no-store" } });
});
