import { z } from "zod";
import { fileName, revisionNumber, revisionNumberText } from "@/lib/fields";
import { formatBytes, runsFileChars } from "@/lib/limits";

// Units follow the model format (design.md): metres, kN. Rotation is in degrees about the run's own axis.

/** A point of a run's centreline, in model coordinates (m, z up). */
export const runPointSchema = z.object({
  x: z.number().finite(),
  y: z.number().finite(),
  z: z.number().finite(),
});

const positiveLength = z.number().finite().positive();

/** A round duct or pipe: outer diameter of the bare duct (insulation is added on top). */
export const roundProfileSchema = z.object({
  shape: z.literal("round"),
  diameter: positiveLength,
});

/**
 * A rectangular duct or tray. With rotation 0 the width lies horizontal and the height vertical (for a vertical
 * riser the width lies along x); rotation turns the section about the run's axis, counter-clockwise seen from the
 * run's start.
 */
export const rectangularProfileSchema = z.object({
  shape: z.literal("rectangular"),
  width: positiveLength,
  height: positiveLength,
  rotation: z.number().finite().min(-360).max(360).default(0),
});

export const profileSchema = z.discriminatedUnion("shape", [roundProfileSchema, rectangularProfileSchema]);

/** Run ids are the designer's own tags (e.g. "SA-01"): they make clash ids stable across imports. */
export const runIdSchema = z
  .string()
  .trim()
  .min(1, "Give the run an id.")
  .max(64, "Keep run ids to 64 characters.")
  .regex(/^[A-Za-z0-9._-]+$/, "Run ids use letters, digits, dot, dash and underscore.");

/** A duct or pipe run: a polyline with one profile, insulation, a required clearance, its system and weight. */
export const runSchema = z
  .object({
    id: runIdSchema,
    name: z.string().trim().max(120).optional(),
    // Systems are data, not a closed list: "supply air", "chilled water", "sprinkler", "cable tray", ...
    system: z.string().trim().min(1, "Name the run's system.").max(80),
    profile: profileSchema,
    insulation: z.number().finite().min(0).max(1).default(0),
    clearance: z.number().finite().min(0).max(2).default(0),
    weightPerMetre: z.number().finite().min(0).max(100),
    points: z.array(runPointSchema).min(2, "A run needs at least two points."),
  })
  .superRefine((run, ctx) => {
    for (let k = 1; k < run.points.length; k++) {
      const a = run.points[k - 1];
      const b = run.points[k];
      if (Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z) < 1e-6) {
        ctx.addIssue({ code: "custom", path: ["points", k], message: `Point ${k + 1} repeats point ${k}: segments need a length.` });
      }
    }
  });

export type RunPoint = z.infer<typeof runPointSchema>;
export type RunProfile = z.infer<typeof profileSchema>;
export type Run = z.infer<typeof runSchema>;
export type RunInput = z.input<typeof runSchema>;

/** The JSON import file: our own format, versioned like the model format. */
export const runsFileSchema = z.object({
  format: z.literal("mep-runs/1"),
  runs: z.array(z.unknown()),
});

/** Edits a designer may make to one stored run (the id stays; clash ids depend on it). */
export const runEditSchema = z.object({
  name: z.string().trim().max(120).optional(),
  system: z.string().trim().min(1).max(80).optional(),
  profile: profileSchema.optional(),
  insulation: z.number().finite().min(0).max(1).optional(),
  clearance: z.number().finite().min(0).max(2).optional(),
  weightPerMetre: z.number().finite().min(0).max(100).optional(),
  points: z.array(runPointSchema).min(2).optional(),
});
export type RunEdit = z.infer<typeof runEditSchema>;

/** Which model revision (by its number in the project) a runs or clashes request is about. */
export const revisionQuerySchema = z.object({ revision: revisionNumberText });

/** Import request: the file's text and name (CSV or JSON), and whether to replace the revision's runs. */
export const importRunsSchema = z.object({
  revision: revisionNumber,
  fileName,
  text: z.string().min(1, "The file is empty.").max(runsFileChars, `Keep run files under ${formatBytes(runsFileChars)}.`),
  mode: z.enum(["replace", "upsert"]).default("upsert"),
});
export type ImportRunsInput = z.infer<typeof importRunsSchema>;

export const editRunRequestSchema = runEditSchema.extend({ revision: revisionNumber });

/** "Hang the services": which revision, and the largest hanger spacing along each run (m). */
const hangerSpacing = z.number().finite().min(0.5, "Hangers closer than 0.5 m are not practical.").max(12, "Hangers further apart than 12 m are not practical.");
export const hangServicesSchema = z.object({
  revision: revisionNumber,
  hangerSpacing: hangerSpacing.default(2.5),
});

/** What a hang-services job keeps of its request: the spacing, and the fingerprint of the runs it was asked for. */
export const hangJobInputSchema = z.strictObject({
  hangerSpacing,
  runs: z.string().regex(/^[0-9a-f]{64}$/),
});
export type HangJobInput = z.output<typeof hangJobInputSchema>;
