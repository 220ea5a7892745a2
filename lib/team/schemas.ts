// Input schemas for the team (invitations, roles): shared by the forms and the route handlers.
import { z } from "zod";
import { emailSchema } from "@/lib/auth/schemas";
import { ROLES } from "@/lib/permissions";

export const roleSchema = z.enum(ROLES, { error: "Choose one of the project roles." });

export const inviteSchema = z.object({ email: emailSchema, role: roleSchema });
export type InviteInput = z.input<typeof inviteSchema>;

export const changeRoleSchema = z.object({ userId: z.uuid("Unknown member."), role: roleSchema });
export type ChangeRoleInput = z.input<typeof changeRoleSchema>;
