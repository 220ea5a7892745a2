// A saved view (a pin's, or a comment's): camera, selected member, result, colouring and section box. Pins keep it
// beside their thread (with a snapshot, lib/bcf/viewpoint.ts), comments inside the comment; BCF exports both.
import { z } from "zod";
import { vec3Schema, type Vec3 } from "./vec3";

/**
 * Largest coordinate a view takes (m). Ours: a roof is well under a kilometre across, so a view a thousand
 * kilometres away is a hostile or broken client, not a camera.
 */
export const VIEW_COORDINATE_LIMIT = 1e6;

const inReach = (v: Vec3) => v.every((c) => Math.abs(c) <= VIEW_COORDINATE_LIMIT);
const place = vec3Schema.refine(inReach, `Coordinates must lie within ±${VIEW_COORDINATE_LIMIT} m.`);
const direction = place.refine((v) => Math.hypot(...v) > 0, "A direction cannot be the zero vector.");

/** What a view keeps; a camera must look somewhere (its target is not where it stands) and a section box's min ≤ max. */
export const viewpointSchema = z.object({
  camera: z
    .object({ position: place, target: place, up: direction.optional(), fieldOfView: z.number().gt(0).lt(180).optional() })
    .refine((c) => c.position.some((v, k) => v !== c.target[k]), { path: ["target"], message: "The camera's target must differ from its position." }),
  selectedMember: z.string().trim().min(1).max(120).optional(),
  result: z.string().trim().min(1).max(120).optional(),
  colouring: z.string().trim().min(1).max(60).optional(),
  sectionBox: z
    .object({ min: place, max: place })
    .refine((box) => box.min.every((v, k) => v <= box.max[k]), { path: ["max"], message: "Each end of the section box must be at or beyond its start." })
    .optional(),
});
export type Viewpoint = z.infer<typeof viewpointSchema>;
