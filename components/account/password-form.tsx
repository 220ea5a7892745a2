"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { apiFetch } from "@/lib/http/fetcher";
import { Button, Field, FormMessage, showServerError } from "@/components/ui/form";

type Values = z.output<typeof changePasswordSchema>;

export function PasswordForm() {
  const [saved, setSaved] = useState<string>();
  const form = useForm<z.input<typeof changePasswordSchema>, unknown, Values>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: "", newPassword: "" },
  });
  const { errors, isSubmitting } = form.formState;

  async function handleSubmit(values: Values) {
    setSaved(undefined);
    try {
      await apiFetch("/api/account/password", { method: "POST", body: values });
      form.reset();
      setSaved("Your password is changed. Every other session is signed out.");
    } catch (error) {
      showServerError(form, error);
    }
  }

  return (
    <form onSubmit={form.handleSubmit(handleSubmit)} className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-5" noValidate data-testid="password-form">
      <h2 className="text-lg font-semibold">Password</h2>
      <Field id="currentPassword" label="Current password" type="password" autoComplete="current-password" error={errors.currentPassword?.message} {...form.register("currentPassword")} />
      <Field id="newPassword" label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.newPassword?.message} {...form.register("newPassword")} />
      <FormMessage message={errors.root?.message} />
      <FormMessage message={saved} tone="success" testId="password-saved" />
      <div>
        <Button type="submit" disabled={isSubmitting}>
          Change password
        </Button>
      </div>
    </form>
  );
}
