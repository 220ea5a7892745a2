// A point or direction in model space (m): three finite numbers. Its own module so the view schemas
// (viewpoint.ts) and the realtime protocol (events.ts) share it without importing each other.
import { z } from "zod";

const finite = z.number().finite();
export const vec3Schema = z.tuple([finite, finite, finite]);
export type Vec3 = z.infer<typeof vec3Schema>;
