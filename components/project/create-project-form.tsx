"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { limitHints } from "@/lib/limit-hints";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { ProjectForMember } from "@/lib/projects/for-member";
import { apiFetch } from "@/lib/http/fetcher";
import {
  COMBINATION_STANDARDS,
  COMBINATION_STANDARD_LABELS,
  DESIGN_STANDARDS,
  DESIGN_STANDARD_LABELS,
  createProjectSchema,
  type CreateProjectInput,
  type CreateProjectValues,
} from "@/lib/projects/schemas";
import { Button, Field, FieldError, FormMessage, showServerError } from "@/components/ui/form";

/**
 * Any signed-in user creates a project and becomes its owner. `organization` is the user's organisation (the
 * one of the first project they own); without one the form asks them to name a new one, as the server does.
 */
export function CreateProjectForm({ organization, onCreatedKey }: { organization: { name: string } | null; onCreatedKey: readonly unknown[] }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const form = useForm<CreateProjectInput, unknown, CreateProjectValues>({
    resolver: zodResolver(createProjectSchema),
    defaultValues: { name: "", description: "", designStandard: "EN1993-1-1", combinationStandard: "EN1990", organizationName: "" },
  });
  const { errors } = form.formState;
  const create = useMutation({
    mutationFn: (values: CreateProjectValues) =>
      apiFetch<{ project: ProjectForMember }>("/api/projects", { method: "POST", body: organization ? { ...values, organizationName: undefined } : values }),
    onSuccess: async ({ project }) => {
      await queryClient.invalidateQueries({ queryKey: onCreatedKey });
      router.push(`/projects/${project.id}`);
    },
    onError: (error) => showServerError(form, error),
  });

  return (
    <section className="flex flex-col gap-4 rounded-xl border border-board-200 bg-white p-5" aria-labelledby="create-project-heading" data-testid="create-project">
      <h2 id="create-project-heading" className="text-lg font-semibold">
        New project
      </h2>
      <form onSubmit={form.handleSubmit((values) => create.mutate(values))} className="flex flex-col gap-3" noValidate data-testid="create-project-form">
        {organization ? (
          <p className="text-sm text-board-700">
            Organisation: <span className="font-medium text-board-900">{organization.name}</span>
          </p>
        ) : (
          <Field id="project-organization" label="Your organisation" hint="You own no project yet: name the organisation this one belongs to (your later projects join it)." error={errors.organizationName?.message} {...form.register("organizationName")} />
        )}
        <Field id="project-name" label="Project name" hint={limitHints.projectName} error={errors.name?.message} {...form.register("name")} />
        <Field id="project-description" label="Description (optional)" hint={limitHints.description} error={errors.description?.message} {...form.register("description")} />
        <div className="grid gap-3 sm:grid-cols-2">
          <div className="flex flex-col gap-1">
            <label htmlFor="project-design-standard" className="text-sm font-medium text-board-800">
              Design standard
            </label>
            <select id="project-design-standard" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("designStandard")}>
              {DESIGN_STANDARDS.map((standard) => (
                <option key={standard} value={standard}>
                  {DESIGN_STANDARD_LABELS[standard]}
                </option>
              ))}
            </select>
            <FieldError message={errors.designStandard?.message} />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor="project-combination-standard" className="text-sm font-medium text-board-800">
              Combination standard
            </label>
            <select id="project-combination-standard" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("combinationStandard")}>
              {COMBINATION_STANDARDS.map((standard) => (
                <option key={standard} value={standard}>
                  {COMBINATION_STANDARD_LABELS[standard]}
                </option>
              ))}
            </select>
            <FieldError message={errors.combinationStandard?.message} />
          </div>
        </div>
        <FormMessage message={errors.root?.message} />
        <Button type="submit" disabled={create.isPending} data-testid="create-project-submit">
          {create.isPending ? "Creating…" : "Create project"}
        </Button>
      </form>
    </section>
  );
}
