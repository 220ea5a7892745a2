"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import type { PresentedMember } from "@/db/queries/memberships";
import { ApiError, apiFetch } from "@/lib/http/fetcher";
import { ROLES, ROLE_LABELS, type Role } from "@/lib/permissions";
import { Button, FormMessage } from "@/components/ui/form";
import { RoleBadge } from "./role-badge";

export const membersQueryKey = (projectId: string) => ["projects", projectId, "members"] as const;

/** The team with roles; owners (as the server said) get a role selector and a remove button per member. */
export function TeamPanel({ projectId, canManage, currentUserId }: { projectId: string; canManage: boolean; currentUserId: string }) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string }>();
  const members = useQuery({
    queryKey: membersQueryKey(projectId),
    queryFn: () => apiFetch<{ members: PresentedMember[] }>(`/api/projects/${projectId}/members`),
  });
  const changeRole = useMutation({
    mutationFn: async (input: { userId: string; role: Role }) => {
      try {
        const { member } = await apiFetch<{ member: PresentedMember }>(`/api/projects/${projectId}/members`, { method: "PATCH", body: input });
        return member;
      } catch (error) {
        // The field's own words ("A project needs at least one owner.") say more than the summary.
        throw error instanceof ApiError && error.issues[0] ? new Error(error.issues[0].message) : error;
      }
    },
    onSuccess: (member) => setMessage({ tone: "success", text: `${member.name} is now ${ROLE_LABELS[member.role]}.` }),
    onError: (error) => setMessage({ tone: "error", text: error.message }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: membersQueryKey(projectId) }),
  });
  const removeMember = useMutation({
    mutationFn: async (member: PresentedMember) => {
      await apiFetch<null>(`/api/projects/${projectId}/members/${member.userId}`, { method: "DELETE" });
      return member;
    },
    onSuccess: (member) => setMessage({ tone: "success", text: `${member.name} is no longer on the team.` }),
    onError: (error) => setMessage({ tone: "error", text: error.message }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: membersQueryKey(projectId) }),
  });

  return (
    <section className="flex flex-col gap-4 rounded-xl border border-board-200 bg-white p-5" aria-labelledby="team-heading" data-testid="team-panel">
      <h2 id="team-heading" className="text-lg font-semibold">
        Team
      </h2>
      <FormMessage message={message?.text} tone={message?.tone} testId="team-message" />
      {members.isPending ? <p className="text-board-700">Loading the team…</p> : null}
      {members.isError ? <FormMessage message={members.error.message} /> : null}
      {members.data ? (
        <ul className="divide-y divide-board-100">
          {members.data.members.map((member) => (
            <li key={member.userId} className="flex flex-wrap items-center gap-3 py-3" data-testid="team-member">
              <div className="min-w-0 flex-1">
                <p className="font-medium">
                  {member.name}
                  {member.userId === currentUserId ? <span className="ml-2 text-xs text-board-700">(you)</span> : null}
                </p>
                <p className="truncate font-mono text-xs text-board-700">{member.email}</p>
              </div>
              {canManage ? (
                <label className="flex items-center gap-2 text-sm">
                  <span className="sr-only">Role of {member.name}</span>
                  <select
                    value={member.role}
                    disabled={changeRole.isPending}
                    onChange={(event) => changeRole.mutate({ userId: member.userId, role: event.target.value as Role })}
                    className="rounded-md border border-board-200 bg-white px-2 py-1"
                    data-testid={`role-select-${member.email}`}
                  >
                    {ROLES.map((role) => (
                      <option key={role} value={role}>
                        {ROLE_LABELS[role]}
                      </option>
                    ))}
                  </select>
                </label>
              ) : null}
              {canManage ? (
                <Button
                  type="button"
                  variant="quiet"
                  disabled={removeMember.isPending}
                  onClick={() => {
                    if (window.confirm(`Remove ${member.name} from this project?`)) removeMember.mutate(member);
                  }}
                  data-testid={`remove-member-${member.email}`}
                >
                  Remove
                </Button>
              ) : (
                <RoleBadge role={member.role} />
              )}
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
