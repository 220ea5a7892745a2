import { z } from "zod";
import { viewpointSchema, type Viewpoint } from "@/lib/realtime/viewpoint";
import type { BcfClippingPlane, BcfViewpoint, Vec3 } from "./types";

/**
 * A saved view as stored on the pin: the view, plus the id of its snapshot PNG in object storage. The id is set
 * only by the server (viewpointSchema strips it), so a client cannot point a view at another file.
 */
export type StoredPinViewpoint = Viewpoint & { snapshotId?: string };

/** Largest snapshot PNG a saved view takes (bytes); its base64 form is a third larger. */
export const SNAPSHOT_BYTES = 5 * 1024 * 1024;

/** PUT …/pins/<id>/viewpoint: the view, and the canvas capture as a PNG data URL (checked again from its bytes). */
export const savePinViewSchema = z.object({
  viewpoint: viewpointSchema,
  snapshot: z
    .string()
    .max(Math.ceil((SNAPSHOT_BYTES * 4) / 3) + 32, "The snapshot is larger than 5 MB.")
    .regex(/^data:image\/png;base64,[A-Za-z0-9+/]+={0,2}$/, "The snapshot must be a PNG data URL.")
    .optional(),
});
export type SavePinViewInput = z.input<typeof savePinViewSchema>;

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const len = (a: Vec3) => Math.hypot(a[0], a[1], a[2]);
const unit = (a: Vec3): Vec3 => [a[0] / len(a), a[1] / len(a), a[2] / len(a)];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
/** Camera distance to the target when a BCF camera (which has none) becomes ours. */
const TARGET_DISTANCE = 10;

/**
 * A BCF viewpoint from a pin's view. BCF clipping planes keep what lies behind the plane (the direction points to the
 * clipped side: BCF-XML documentation, from memory), so a section box becomes six planes pointing outwards.
 */
export function toBcfViewpoint(guid: string, view: Viewpoint, globalIdOf: (memberId: string) => string): BcfViewpoint {
  const direction = unit(sub(view.camera.target, view.camera.position));
  const upHint = view.camera.up ?? [0, 0, 1];
  // The up vector must be perpendicular to the direction; looking straight down, y is up.
  const raw: Vec3 = Math.abs(dot(upHint, direction)) > 0.999 ? [0, 1, 0] : upHint;
  const up = unit(sub(raw, direction.map((d) => d * dot(raw, direction)) as Vec3));
  const planes: BcfClippingPlane[] = view.sectionBox
    ? [0, 1, 2].flatMap((axis) => {
        const normal = (sign: number): Vec3 => [0, 1, 2].map((k) => (k === axis ? sign : 0)) as Vec3;
        return [
          { location: view.sectionBox!.min, direction: normal(-1) },
          { location: view.sectionBox!.max, direction: normal(1) },
        ];
      })
    : [];
  return {
    guid,
    camera: { kind: "perspective", position: view.camera.position, direction, up, fieldOfView: view.camera.fieldOfView ?? 50, aspectRatio: 1.6 },
    selection: view.selectedMember ? [globalIdOf(view.selectedMember)] : [],
    clippingPlanes: planes,
  };
}

/** A pin's view from a BCF viewpoint; the section box is kept only when the planes are six axis-aligned faces. */
export function fromBcfViewpoint(viewpoint: BcfViewpoint, memberOf: (globalId: string) => string | undefined): Viewpoint | undefined {
  const camera = viewpoint.camera;
  if (!camera) return undefined;
  const d = unit(camera.direction);
  const target: Vec3 = [camera.position[0] + d[0] * TARGET_DISTANCE, camera.position[1] + d[1] * TARGET_DISTANCE, camera.position[2] + d[2] * TARGET_DISTANCE];
  const selectedMember = viewpoint.selection.map(memberOf).find((m) => m !== undefined);
  const view: Viewpoint = { camera: { position: camera.position, target, up: camera.up, ...(camera.kind === "perspective" ? { fieldOfView: camera.fieldOfView } : {}) } };
  if (selectedMember) view.selectedMember = selectedMember;
  const box = sectionBoxOf(viewpoint.clippingPlanes);
  if (box) view.sectionBox = box;
  return viewpointSchema.safeParse(view).success ? view : undefined;
}

function sectionBoxOf(planes: BcfClippingPlane[]): Viewpoint["sectionBox"] {
  if (planes.length !== 6) return undefined;
  const min: Vec3 = [Number.NaN, Number.NaN, Number.NaN];
  const max: Vec3 = [Number.NaN, Number.NaN, Number.NaN];
  for (const p of planes) {
    const axis = [0, 1, 2].find((k) => Math.abs(Math.abs(p.direction[k]) - 1) < 1e-9 && len(p.direction) < 1 + 1e-9);
    if (axis === undefined) return undefined;
    (p.direction[axis] < 0 ? min : max)[axis] = p.location[axis];
  }
  return [...min, ...max].every(Number.isFinite) ? { min, max } : undefined;
}
