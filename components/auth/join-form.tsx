"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { limitHints } from "@/lib/limit-hints";
import { useMutation } from "@tanstack/react-query";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { joinSchema } from "@/lib/auth/schemas";
import { apiFetch } from "@/lib/http/fetcher";
import { Button, Field, FormMessage, showServerError } from "@/components/ui/form";

type JoinValues = z.output<typeof joinSchema>;

/** A newcomer sets their name and password; the account and membership are created together, then they sign in. */
export function JoinForm({ token, email, projectId }: { token: string; email: string; projectId: string }) {
  const router = useRouter();
  const form = useForm<z.input<typeof joinSchema>, unknown, JoinValues>({ resolver: zodResolver(joinSchema), defaultValues: { name: "", password: "" } });
  const { errors, isSubmitting } = form.formState;

  async function handleSubmit(values: JoinValues) {
    try {
      await apiFetch(`/api/invitations/${encodeURIComponent(token)}`, { method: "POST", body: values });
    } catch (error) {
      showServerError(form, error);
      return;
    }
    const result = await signIn("credentials", { email, password: values.password, redirect: false });
    router.push(result?.ok ? `/projects/${projectId}` : "/sign-in");
    router.refresh();
  }

  return (
    <form onSubmit={form.handleSubmit(handleSubmit)} className="flex flex-col gap-4" noValidate data-testid="join-form">
      <Field id="name" label="Your name" autoComplete="name" hint={limitHints.personName} error={errors.name?.message} {...form.register("name")} />
      <Field id="password" label="Choose a password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.password?.message} {...form.register("password")} />
      <FormMessage message={errors.root?.message} />
      <Button type="submit" disabled={isSubmitting} data-testid="join-submit">
        {isSubmitting ? "Joining…" : "Join the project"}
      </Button>
    </form>
  );
}

/** The signed-in invitee accepts with one click. */
export function AcceptInvitationButton({ token, projectId }: { token: string; projectId: string }) {
  const router = useRouter();
  const accept = useMutation({
    mutationFn: () => apiFetch(`/api/invitations/${encodeURIComponent(token)}`, { method: "POST", body: {} }),
    onSuccess: () => {
      router.push(`/projects/${projectId}`);
      router.refresh();
    },
  });
  return (
    <div className="flex flex-col gap-3">
      <FormMessage message={accept.error?.message} />
      <Button onClick={() => accept.mutate()} disabled={accept.isPending} data-testid="join-accept">
        {accept.isPending ? "Accepting…" : "Accept the invitation"}
      </Button>
    </div>
  );
}
