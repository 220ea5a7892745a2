"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import type { PresentedInvitation } from "@/db/queries/invitations";
import { apiFetch } from "@/lib/http/fetcher";
import { ROLES, ROLE_LABELS } from "@/lib/permissions";
import { inviteSchema } from "@/lib/team/schemas";
import { Button, Field, FieldError, FormMessage, showServerError } from "@/components/ui/form";

type InviteValues = z.output<typeof inviteSchema>;
const invitationsKey = (projectId: string) => ["projects", projectId, "invitations"] as const;

/** Owners invite by e-mail with a role; the join link is shown to copy (and e-mailed where mail is set up). */
export function InvitePanel({ projectId }: { projectId: string }) {
  const queryClient = useQueryClient();
  const [joinLink, setJoinLink] = useState<string>();
  const form = useForm<z.input<typeof inviteSchema>, unknown, InviteValues>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: "", role: "architect" },
  });
  const { errors } = form.formState;
  const pending = useQuery({
    queryKey: invitationsKey(projectId),
    queryFn: () => apiFetch<{ invitations: PresentedInvitation[] }>(`/api/projects/${projectId}/invitations`),
  });
  const invite = useMutation({
    mutationFn: (values: InviteValues) => apiFetch<{ joinLink: string }>(`/api/projects/${projectId}/invitations`, { method: "POST", body: values }),
    onMutate: () => setJoinLink(undefined),
    onSuccess: (result) => {
      setJoinLink(result.joinLink);
      form.reset({ email: "", role: form.getValues("role") });
      return queryClient.invalidateQueries({ queryKey: invitationsKey(projectId) });
    },
    onError: (error) => showServerError(form, error),
  });
  const cancel = useMutation({
    mutationFn: (invitation: PresentedInvitation) => apiFetch<null>(`/api/projects/${projectId}/invitations/${invitation.id}`, { method: "DELETE" }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: invitationsKey(projectId) }),
  });

  return (
    <section className="flex flex-col gap-4 rounded-xl border border-board-200 bg-white p-5" aria-labelledby="invite-heading" data-testid="invite-panel">
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite someone
      </h2>
      <form onSubmit={form.handleSubmit((values) => invite.mutate(values))} className="flex flex-col gap-3" noValidate data-testid="invite-form">
        <Field id="invite-email" label="E-mail" type="email" error={errors.email?.message} {...form.register("email")} />
        <div className="flex flex-col gap-1">
          <label htmlFor="invite-role" className="text-sm font-medium text-board-800">
            Role
          </label>
          <select id="invite-role" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("role")}>
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABELS[role]}
              </option>
            ))}
          </select>
          <FieldError message={errors.role?.message} />
        </div>
        <FormMessage message={errors.root?.message} />
        <Button type="submit" disabled={invite.isPending} data-testid="invite-submit">
          {invite.isPending ? "Inviting…" : "Create invitation"}
        </Button>
      </form>
      {joinLink ? (
        <div className="flex flex-col gap-1 text-sm">
          <label htmlFor="join-link">Join link (valid for 7 days, works once)</label>
          <input id="join-link" readOnly value={joinLink} className="rounded-md border border-board-200 bg-board-50 px-2 py-1 font-mono text-xs" data-testid="join-link" onFocus={(e) => e.currentTarget.select()} />
        </div>
      ) : null}
      {pending.data && pending.data.invitations.length > 0 ? (
        <div className="flex flex-col gap-2">
          <h3 className="text-sm font-medium">Waiting to join</h3>
          <ul className="flex flex-col gap-1 text-sm" data-testid="pending-invitations">
            {pending.data.invitations.map((invitation) => (
              <li key={invitation.id} className="flex items-center justify-between gap-2">
                <span className="min-w-0 flex-1 truncate font-mono text-xs">{invitation.email}</span>
                <span className="text-board-700">{ROLE_LABELS[invitation.role]}</span>
                <Button type="button" variant="quiet" disabled={cancel.isPending} onClick={() => cancel.mutate(invitation)} data-testid={`cancel-invitation-${invitation.email}`}>
                  Cancel
                </Button>
              </li>
            ))}
          </ul>
          <FormMessage message={cancel.error?.message} />
        </div>
      ) : null}
    </section>
  );
}
