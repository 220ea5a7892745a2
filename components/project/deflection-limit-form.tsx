"use client";
// The project's serviceability deflection limit span/N, for those the rule book lets change it ("project.settings").
// A change by another member arrives as a live event (useProjectSettings): the field takes the new value unless
// this member is editing it, and the stored limit is always shown beside it.

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import { Button, Field, FormMessage, showServerError } from "@/components/ui/form";
import { apiFetch } from "@/lib/http/fetcher";
import { projectSettingsSchema, type ProjectSettings, type ProjectSettingsInput } from "@/lib/projects/schemas";
import { DEFAULT_DEFLECTION_LIMIT, DEFLECTION_LIMIT_BOUNDS } from "@/lib/projects/deflection-limit";
import { settingsKey, useProjectSettings } from "./use-project-settings";

export function DeflectionLimitForm({ projectId, deflectionLimit }: { projectId: string; deflectionLimit: number }) {
  const queryClient = useQueryClient();
  const stored = useProjectSettings(projectId, { deflectionLimit }).data?.deflectionLimit ?? deflectionLimit;
  const [saved, setSaved] = useState<number>();
  const form = useForm<ProjectSettingsInput, unknown, ProjectSettings>({ resolver: zodResolver(projectSettingsSchema), defaultValues: { deflectionLimit } });
  const { errors } = form.formState;
  useEffect(() => {
    // Someone else's change: an untouched field follows it; a value being typed is left for its author to save or not.
    if (!form.formState.isDirty) form.reset({ deflectionLimit: stored });
  }, [stored, form]);
  const save = useMutation({
    mutationFn: (values: ProjectSettings) => apiFetch<{ settings: ProjectSettings }>(`/api/projects/${projectId}`, { method: "PATCH", body: values }),
    onMutate: () => setSaved(undefined),
    onSuccess: ({ settings }) => {
      setSaved(settings.deflectionLimit);
      form.reset(settings);
      queryClient.setQueryData(settingsKey(projectId), settings);
    },
    onError: (error) => showServerError(form, error),
  });
  return (
    <section className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-5" aria-labelledby="deflection-limit-heading" data-testid="deflection-limit-panel">
      <h2 id="deflection-limit-heading" className="text-lg font-semibold">
        Deflection limit
      </h2>
      <form onSubmit={form.handleSubmit((values) => save.mutate(values))} className="flex flex-col gap-3" noValidate data-testid="deflection-limit-form">
        <Field
          id="deflection-limit"
          label="Serviceability combinations: vertical deflection at most span / N, where N is"
          type="number"
          step={1}
          min={DEFLECTION_LIMIT_BOUNDS.min}
          max={DEFLECTION_LIMIT_BOUNDS.max}
          hint={`Default span/${DEFAULT_DEFLECTION_LIMIT} (common practice for roofs; the project's specification or National Annex may set another). Between ${DEFLECTION_LIMIT_BOUNDS.min} and ${DEFLECTION_LIMIT_BOUNDS.max}. Applies from the next analysis: revisions already analysed keep the limit they were checked against.`}
          error={errors.deflectionLimit?.message}
          {...form.register("deflectionLimit", { valueAsNumber: true })}
        />
        <p className="text-sm text-board-700" data-testid="deflection-limit-stored">
          The project&apos;s limit now: span/{stored}.
        </p>
        <FormMessage message={errors.root?.message} />
        <FormMessage tone="success" testId="deflection-limit-saved" message={saved === undefined ? undefined : `Saved: span/${saved} from the next analysis.`} />
        <Button type="submit" disabled={save.isPending} data-testid="deflection-limit-submit">
          {save.isPending ? "Saving…" : "Save limit"}
        </Button>
      </form>
    </section>
  );
}
