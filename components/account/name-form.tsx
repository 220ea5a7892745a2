"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { limitHints } from "@/lib/limit-hints";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { updateAccountSchema } from "@/lib/auth/schemas";
import { apiFetch } from "@/lib/http/fetcher";
import { Button, Field, FormMessage, showServerError } from "@/components/ui/form";

type Values = z.output<typeof updateAccountSchema>;

export function NameForm({ name }: { name: string }) {
  const router = useRouter();
  const [saved, setSaved] = useState<string>();
  const form = useForm<z.input<typeof updateAccountSchema>, unknown, Values>({ resolver: zodResolver(updateAccountSchema), defaultValues: { name } });
  const { errors, isSubmitting } = form.formState;

  async function handleSubmit(values: Values) {
    setSaved(undefined);
    try {
      await apiFetch("/api/account", { method: "PATCH", body: values });
      setSaved("Your name is saved.");
      router.refresh();
    } catch (error) {
      showServerError(form, error);
    }
  }

  return (
    <form onSubmit={form.handleSubmit(handleSubmit)} className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-5" noValidate data-testid="name-form">
      <h2 className="text-lg font-semibold">Name</h2>
      <Field id="account-name" label="Name shown to your team" autoComplete="name" hint={limitHints.personName} error={errors.name?.message} {...form.register("name")} />
      <FormMessage message={errors.root?.message} />
      <FormMessage message={saved} tone="success" testId="name-saved" />
      <div>
        <Button type="submit" disabled={isSubmitting}>
          Save name
        </Button>
      </div>
    </form>
  );
}
