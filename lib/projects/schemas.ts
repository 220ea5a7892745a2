// Input schemas for creating a project (the create-project form and POST /api/projects) and for changing its
// settings (the settings form and PATCH /api/projects/[projectId]).
import { z } from "zod";
import { DEFLECTION_LIMIT_BOUNDS } from "./deflection-limit";
import { COMBINATION_STANDARDS, DESIGN_STANDARDS } from "./standards";

export { COMBINATION_STANDARDS, DESIGN_STANDARDS };

export const DESIGN_STANDARD_LABELS: Record<(typeof DESIGN_STANDARDS)[number], string> = {
  "AISC360-22": "AISC 360-22 (LRFD)",
  "EN1993-1-1": "EN 1993-1-1",
};

export const COMBINATION_STANDARD_LABELS: Record<(typeof COMBINATION_STANDARDS)[number], string> = {
  "ASCE7-22": "ASCE 7-22",
  EN1990: "EN 1990",
};

export const createProjectSchema = z.object({
  name: z.string().trim().min(1, "Give the project a name.").max(120, "Keep the name under 120 characters."),
  description: z.string().trim().max(2000, "Keep the description under 2000 characters.").default(""),
  designStandard: z.enum(DESIGN_STANDARDS, { error: "Choose a design standard." }),
  combinationStandard: z.enum(COMBINATION_STANDARDS, { error: "Choose a combination standard." }),
  // Only read when the user owns no project yet, so has no organisation (see lib/commands/create-project.ts).
  organizationName: z.string().trim().max(120, "Keep the organisation name under 120 characters.").optional(),
});
export type CreateProjectInput = z.input<typeof createProjectSchema>;
export type CreateProjectValues = z.output<typeof createProjectSchema>;

const { min, max } = DEFLECTION_LIMIT_BOUNDS;

/** The project's settings an owner or structural engineer may change (lib/permissions "project.settings"). */
export const projectSettingsSchema = z.strictObject({
  deflectionLimit: z
    .number({ error: "Give the deflection limit as a number: the N in span/N." })
    // multipleOf rather than int: zod stops at a failed int, and the answer should list the bounds problem too
    .multipleOf(1, "Give a whole number: the N in span/N.")
    .min(min, `The limit is span/${min} at the loosest.`)
    .max(max, `The limit is span/${max} at the strictest.`),
});
export type ProjectSettingsInput = z.input<typeof projectSettingsSchema>;
export type ProjectSettings = z.output<typeof projectSettingsSchema>;
