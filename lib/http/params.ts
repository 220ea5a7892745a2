// Route params schemas shared by route handlers and pages.
import { z } from "zod";

export const projectParamsSchema = z.object({ projectId: z.uuid() });
export const tokenParamsSchema = z.object({ token: z.string().min(20).max(200) });
export const invitationParamsSchema = projectParamsSchema.extend({ invitationId: z.uuid() });
export const memberParamsSchema = projectParamsSchema.extend({ userId: z.uuid() });
export const jobParamsSchema = projectParamsSchema.extend({ jobId: z.uuid() });
