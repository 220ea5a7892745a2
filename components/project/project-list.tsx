"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import type { ProjectForMember } from "@/db/queries/projects";
import { apiFetch } from "@/lib/http/fetcher";
import { FormMessage } from "@/components/ui/form";
import { RoleBadge } from "./role-badge";

export const projectsQueryKey = ["projects"] as const;

/** The signed-in user's projects, fetched from /api/projects. */
export function ProjectList() {
  const query = useQuery({ queryKey: projectsQueryKey, queryFn: () => apiFetch<{ projects: ProjectForMember[] }>("/api/projects") });
  if (query.isPending) return <p className="text-board-700">Loading your projects…</p>;
  if (query.isError) return <FormMessage message={query.error.message} />;
  if (query.data.projects.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-board-200 p-6 text-board-700" data-testid="projects-empty">
        You are not on any project yet. Ask a project owner to invite you.
      </p>
    );
  }
  return (
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
  );
}
