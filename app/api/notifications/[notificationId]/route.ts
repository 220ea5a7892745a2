import { z } from "zod";
import { markNotificationRead } from "@/db/queries/notifications";
import { NotFoundError } from "@/lib/http/errors";
import { accountRoute } from "@/lib/http/route";

const paramsSchema = z.object({ notificationId: z.uuid() });
const bodySchema = z.object({ read: z.literal(true) });

/** Marks one of the signed-in person's notifications read. */
export const PATCH = accountRoute({ params: paramsSchema, body: bodySchema }, async ({ params, user }) => {
  const notification = await markNotificationRead({ userId: user.id, notificationId: params.notificationId });
  if (!notification) throw new NotFoundError("No such notification.");
  return Response.json({ notification });
});
