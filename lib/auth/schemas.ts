// Input schemas for sign-in, joining and the account: shared by the forms (react-hook-form) and the server.
import { z } from "zod";
import { text } from "@/lib/limits";
import { passwordWeakness } from "./password-strength";

/** Starts the message of a sign-in refused for its input (the form shows these as they are; lib/auth/options.ts). */
export const SIGN_IN_REFUSED = "Sign-in refused:";

export const emailSchema = z
  .string()
  .trim()
  .min(1, "Enter an e-mail address.")
  .max(text.email, `That e-mail address is too long (at most ${text.email} characters).`)
  .pipe(z.email("Enter a valid e-mail address."))
  .transform((email) => email.toLowerCase());

export const newPasswordSchema = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.")
  .superRefine((password, context) => {
    // One problem at a time: a too-short or too-long password has already been told so.
    if (password.length < 10 || password.length > 200) return;
    const weakness = passwordWeakness(password);
    if (weakness) context.addIssue({ code: "custom", message: weakness });
  });

export const personNameSchema = z.string().trim().min(1, "Enter your name.").max(120, "Use at most 120 characters.");

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "Enter your password.").max(text.password, `That password is too long (at most ${text.password} characters).`),
});
export type SignInInput = z.input<typeof signInSchema>;

/** Joining by invitation with a new account. */
export const joinSchema = z.object({
  name: personNameSchema,
  password: newPasswordSchema,
});
export type JoinInput = z.input<typeof joinSchema>;

export const updateAccountSchema = z.object({ name: personNameSchema });
export type UpdateAccountInput = z.input<typeof updateAccountSchema>;

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "Enter your current password."),
    newPassword: newPasswordSchema,
  })
  .refine((value) => value.newPassword !== value.currentPassword, {
    path: ["newPassword"],
    message: "Choose a password different from the current one.",
  });
export type ChangePasswordInput = z.input<typeof changePasswordSchema>;
