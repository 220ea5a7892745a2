"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { limitHints } from "@/lib/limit-hints";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { StepProgress } from "@/components/jobs/job-progress";
import { Button, Field, FieldError, FormMessage, showServerError } from "@/components/ui/form";
import { roofParamsSchema } from "@/lib/analysis/generator";
import { ApiError, apiFetch } from "@/lib/http/fetcher";
import { revisionsKey } from "./revision-list";

type RoofInput = z.input<typeof roofParamsSchema>;
type RoofValues = z.output<typeof roofParamsSchema>;

const numberFields: { name: keyof RoofInput & string; label: string; unit: string; hint?: string }[] = [
  { name: "spanX", label: "Span along x", unit: "m", hint: limitHints.span },
  { name: "spanY", label: "Span along y", unit: "m", hint: limitHints.span },
  { name: "module", label: "Grid module", unit: "m", hint: limitHints.module },
  { name: "depth", label: "Depth between layers", unit: "m", hint: limitHints.depth },
  { name: "roofing", label: "Roofing (superimposed dead)", unit: "kN/m²" },
  { name: "snow", label: "Snow", unit: "kN/m²" },
  { name: "windUplift", label: "Wind uplift", unit: "kN/m²" },
  { name: "services", label: "Services on the bottom layer", unit: "kN/m²" },
  { name: "imposed", label: "Roof imposed (maintenance), 0 for none", unit: "kN/m²", hint: "Not combined with snow or wind (EN 1991-1-1 3.3.2)." },
  { name: "pointLoad", label: "Maintenance point load, 0 for none", unit: "kN" },
];

/** The roof generator as a form; saving stores a new revision and runs its analysis. */
export function GenerateForm({ projectId, onSaved }: { projectId: string; onSaved: (number: number) => void }) {
  const queryClient = useQueryClient();
  const form = useForm<RoofInput, unknown, RoofValues>({
    resolver: zodResolver(roofParamsSchema),
    defaultValues: { name: "Sports hall roof", pattern: "square_on_square_offset", spanX: 48, spanY: 36, module: 3, depth: 1.8, roofing: 0.6, snow: 0.8, windUplift: 0.7, services: 0.25, fabrication: "hot-finished", imposed: 0, pointLoad: 0, unbalancedSnow: false, combinationRule: "6.10", snowDriftEdge: "none", stepHeight: 0, upperRoofWidth: 0, windZones: false, windPeakPressure: 0, roofHeight: 0 },
  });
  const pattern = useWatch({ control: form.control, name: "pattern" });
  const driftEdge = useWatch({ control: form.control, name: "snowDriftEdge" });
  const windZones = useWatch({ control: form.control, name: "windZones" });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (params: RoofValues) => apiFetch<{ revision: { number: number } }>(`/api/projects/${projectId}/models`, { method: "POST", body: { kind: "generate", params } }),
    onSuccess: async ({ revision }) => {
      await queryClient.invalidateQueries({ queryKey: revisionsKey(projectId) });
      onSaved(revision.number);
    },
    onError: (error) => {
      // The server names fields "params.spanX"; the form's fields are the parameters themselves.
      const local = error instanceof ApiError ? new ApiError(error.status, error.message, error.issues.map((i) => ({ ...i, path: i.path.replace(/^params\.?/, "") }))) : error;
      showServerError(form, local);
    },
  });
  return (
    <form onSubmit={form.handleSubmit((values) => save.mutate(values))} noValidate className="flex flex-col gap-3" data-testid="generate-form">
      <Field id="roof-name" label="Name" hint={limitHints.name} error={errors.name?.message} {...form.register("name")} />
      <div className="flex flex-col gap-1">
        <label htmlFor="roof-pattern" className="text-sm font-medium text-board-800">
          Grid pattern
        </label>
        <select id="roof-pattern" aria-describedby="roof-pattern-hint" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("pattern")}>
          <option value="square_on_square_offset">Square on square, offset half a module</option>
          <option value="square_on_diagonal">Square on diagonal, bottom nodes under every other bay</option>
        </select>
        <p className="text-xs text-board-700" id="roof-pattern-hint">
          {pattern === "square_on_diagonal"
            ? "About a quarter fewer members; every edge node is held normal to its wall, so the roof cannot expand freely."
            : "Every edge node bears vertically; three plan restraints leave the roof free to expand."}
        </p>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="roof-fabrication" className="text-sm font-medium text-board-800">
          Tubes
        </label>
        <select id="roof-fabrication" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("fabrication")}>
          <option value="hot-finished">Hot finished (EN 10210): buckling curve a</option>
          <option value="cold-formed">Cold formed (EN 10219, ERW): buckling curve c, AISC wall 0.93·t</option>
        </select>
      </div>
      <div className="grid grid-cols-2 gap-3">
        {numberFields.map((f) => (
          <Field key={f.name} id={`roof-${f.name}`} label={`${f.label} (${f.unit})`} hint={f.hint} type="number" step="any" error={errors[f.name]?.message} {...form.register(f.name, { valueAsNumber: true })} />
        ))}
      </div>
      <Field
        id="roof-pointLoadNode"
        label="Point load at top node (T-i-j, i along x, j along y; the centre when empty)"
        error={errors.pointLoadNode?.message}
        {...form.register("pointLoadNode", { setValueAs: (v: string) => (v === "" ? undefined : v) })}
      />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" {...form.register("unbalancedSnow")} data-testid="roof-unbalanced-snow" />
        Unbalanced snow as well: full on one half of the span, half on the other, each half in both directions
      </label>
      <div className="flex flex-col gap-1">
        <label htmlFor="roof-snowDriftEdge" className="text-sm font-medium text-board-800">
          Snow drift at a step (EN 1991-1-3 5.3.6)
        </label>
        <select id="roof-snowDriftEdge" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("snowDriftEdge")} aria-describedby="roof-snowDriftEdge-error">
          <option value="none">No higher roof beside this one</option>
          <option value="west">A higher roof along the west edge (x = 0)</option>
          <option value="east">A higher roof along the east edge</option>
          <option value="south">A higher roof along the south edge (y = 0)</option>
          <option value="north">A higher roof along the north edge</option>
        </select>
        <FieldError id="roof-snowDriftEdge-error" message={errors.snowDriftEdge?.message} />
      </div>
      {driftEdge !== "none" ? (
        <div className="grid grid-cols-2 gap-3">
          <Field id="roof-stepHeight" label="Height of the step (m)" type="number" step="any" error={errors.stepHeight?.message} {...form.register("stepHeight", { valueAsNumber: true })} />
          <Field id="roof-upperRoofWidth" label="Width of the higher roof, b1 (m)" type="number" step="any" error={errors.upperRoofWidth?.message} {...form.register("upperRoofWidth", { valueAsNumber: true })} />
        </div>
      ) : null}
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" {...form.register("windZones")} data-testid="roof-wind-zones" />
        Wind zones F, G, H, I of EN 1991-1-4 7.2.3 from each edge, zone I in suction and in pressure
      </label>
      <FieldError id="roof-windZones-error" message={errors.windZones?.message} />
      {windZones ? (
        <div className="grid grid-cols-2 gap-3">
          <Field id="roof-windPeakPressure" label="Peak velocity pressure qp (kN/m²)" type="number" step="any" error={errors.windPeakPressure?.message} {...form.register("windPeakPressure", { valueAsNumber: true })} />
          <Field id="roof-roofHeight" label="Roof height above ground (m)" type="number" step="any" error={errors.roofHeight?.message} {...form.register("roofHeight", { valueAsNumber: true })} />
        </div>
      ) : null}
      <div className="flex flex-col gap-1">
        <label htmlFor="roof-combination-rule" className="text-sm font-medium text-board-800">
          EN 1990 combinations
        </label>
        <select id="roof-combination-rule" className="rounded-md border border-board-200 bg-white px-3 py-2" {...form.register("combinationRule")}>
          <option value="6.10">Expression (6.10): 1.35G + 1.5Q</option>
          <option value="6.10a/6.10b">Expressions (6.10a) and (6.10b): 1.35G + 1.5ψ0Q and 0.85·1.35G + 1.5Q</option>
        </select>
      </div>
      <p className="text-xs text-board-700" data-testid="generate-limits">
        {limitHints.generator}
      </p>
      <FormMessage message={errors.root?.message} />
      {save.isPending ? <StepProgress phase="Generating the roof and queuing its analysis" /> : null}
      <Button type="submit" disabled={save.isPending} data-testid="generate-submit">
        {save.isPending ? "Generating…" : "Generate, save and analyse"}
      </Button>
    </form>
  );
}
