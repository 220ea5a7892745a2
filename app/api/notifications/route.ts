import { z } from "zod";
import { listNotificationsForUser } from "@/db/queries/notifications";
import { requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { parseWith } from "@/lib/http/parse";

const querySchema = z.object({ unread: z.enum(["1", "0"]).optional() });

/** The signed-in person's notifications, newest first (?unread=1 for unread only). */
export const GET = handleRoute(async (request: Request) => {
  const user = requireUser(await getRequestUser(request));
  const { unread } = parseWith(querySchema, Object.fromEntries(new URL(request.url).searchParams));
  return Response.json({ notifications: await listNotificationsForUser({ userId: user.id, unreadOnly: unread === "1" }) });
});
