"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import type { ProjectForMember } from "@/lib/projects/for-member";
import { apiFetch } from "@/lib/http/fetcher";
import { FormMessage } from "@/components/ui/form";
import { CreateProjectForm } from "./create-project-form";
import { RoleBadge } from "./role-badge";

export const projectsQueryKey = ["projects"] as const;

/** The user's organisation as the server picks it: the one of the first project they own (see createProject). */
function ownedOrganization(projects: ProjectForMember[]): { name: string } | null {
  const owned = projects.filter((p) => p.role === "owner").sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id));
  return owned[0]?.organization ?? null;
}

/** The signed-in user's projects, fetched from /api/projects, and the form to create one. */
export function ProjectList() {
  const query = useQuery({ queryKey: projectsQueryKey, queryFn: () => apiFetch<{ projects: ProjectForMember[] }>("/api/projects") });
  if (query.isPending) return <p className="text-board-700">Loading your projects…</p>;
  if (query.isError) return <FormMessage message={query.error.message} />;
  const createForm = <CreateProjectForm organization={ownedOrganization(query.data.projects)} onCreatedKey={projectsQueryKey} />;
  if (query.data.projects.length === 0) {
    return (
      <div className="flex flex-col gap-4">
        <p className="rounded-lg border border-dashed border-board-200 p-6 text-board-700" data-testid="projects-empty">
          You are not on any project yet. Start one below, or ask a project owner to invite you.
        </p>
        {createForm}
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-6">
      <ul className="grid gap-4 sm:grid-cols-2" data-testid="project-list">
        {query.data.projects.map((project) => (
          <li key={project.id}>
            <Link href={`/projects/${project.id}`} className="flex h-full flex-col gap-2 rounded-xl border border-board-200 bg-white p-5 shadow-sm transition-colors hover:border-tension" data-testid="project-card">
              <span className="text-xs uppercase tracking-wide text-board-700">{project.organization.name}</span>
              <span className="text-lg font-semibold">{project.name}</span>
              {project.description ? <span className="text-sm text-board-700">{project.description}</span> : null}
              <span className="mt-auto pt-2">
                <RoleBadge role={project.role} />
              </span>
            </Link>
          </li>
        ))}
      </ul>
      {createForm}
    </div>
  );
}
