import { z } from "zod";
import { markNotificationRead } from "@/db/queries/notifications";
import { requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute, NotFoundError } from "@/lib/http/errors";
import { parseJson, parseParams } from "@/lib/http/parse";

type Context = RouteContext<"/api/notifications/[notificationId]">;

const paramsSchema = z.object({ notificationId: z.uuid() });
const bodySchema = z.object({ read: z.literal(true) });

/** Marks one of the signed-in person's notifications read. */
export const PATCH = handleRoute(async (request: Request, context: Context) => {
  const { notificationId } = parseParams(paramsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await parseJson(request, bodySchema);
  const notification = await markNotificationRead({ userId: user.id, notificationId });
  if (!notification) throw new NotFoundError("No such notification.");
  return Response.json({ notification });
});
