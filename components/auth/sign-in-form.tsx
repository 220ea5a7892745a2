"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { SIGN_IN_REFUSED, signInSchema } from "@/lib/auth/schemas";
import { Button, Field, FormMessage } from "@/components/ui/form";

/** E-mail and password; a wrong pair is reported beside the password field. */
export function SignInForm({ callbackUrl, defaultEmail = "" }: { callbackUrl: string; defaultEmail?: string }) {
  const router = useRouter();
  const form = useForm<z.input<typeof signInSchema>, unknown, z.output<typeof signInSchema>>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: defaultEmail, password: "" },
  });
  const { errors, isSubmitting } = form.formState;

  async function handleSubmit(values: z.output<typeof signInSchema>) {
    const result = await signIn("credentials", { ...values, redirect: false });
    if (!result || result.error) {
      const error = result?.error;
      const message =
        error === "CredentialsSignin"
          ? "E-mail or password is incorrect."
          : error?.startsWith("Too many") || error?.startsWith(SIGN_IN_REFUSED)
            ? error
            : "Signing in failed. Please try again.";
      form.setError("password", { message });
      return;
    }
    router.push(callbackUrl);
    router.refresh();
  }

  return (
    <form onSubmit={form.handleSubmit(handleSubmit)} className="flex flex-col gap-4" noValidate data-testid="sign-in-form">
      <Field id="email" label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register("email")} />
      <Field id="password" label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register("password")} />
      <FormMessage message={errors.root?.message} />
      <Button type="submit" disabled={isSubmitting} data-testid="sign-in-submit">
        {isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
