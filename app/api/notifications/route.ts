import { z } from "zod";
import { listNotificationsForUser } from "@/db/queries/notifications";
import { accountRoute } from "@/lib/http/route";

const querySchema = z.object({ unread: z.enum(["1", "0"]).optional() });

/** The signed-in person's notifications, newest first (?unread=1 for unread only). */
export const GET = accountRoute({ query: querySchema }, async ({ user, query }) =>
  Response.json({ notifications: await listNotificationsForUser({ userId: user.id, unreadOnly: query.unread === "1" }) }),
);
