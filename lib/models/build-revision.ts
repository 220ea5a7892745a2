// Turns a create-revision request into a validated model, or the full list of problems.
import { generateRoof } from "@/lib/analysis/generator";
import { modelFromCsv } from "@/lib/analysis/csv";
import { validateModel, type ModelProblem, type TrussModel } from "@/lib/analysis/model";
import type { InlineRevisionRequest } from "./schemas";

export type BuiltRevision =
  | { ok: true; model: TrussModel; name: string; source: "generated" | "uploaded" }
  | { ok: false; problems: ModelProblem[] };

/** Generates, parses or validates the model named by the request; every validation problem is returned. */
export function buildRevision(input: InlineRevisionRequest): BuiltRevision {
  switch (input.kind) {
    case "generate": {
      const model = generateRoof(input.params);
      return { ok: true, model, name: model.name, source: "generated" };
    }
    case "uploadJson": {
      const checked = validateModel(input.model);
      return checked.ok ? { ok: true, model: checked.model, name: input.name ?? checked.model.name, source: "uploaded" } : checked;
    }
    case "uploadCsv": {
      const checked = modelFromCsv(input.tables, { name: input.name });
      return checked.ok ? { ok: true, model: checked.model, name: input.name, source: "uploaded" } : checked;
    }
  }
}
