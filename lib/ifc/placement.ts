import { nums, refId, type IfcReader } from "./reader";

export type Vec3 = [number, number, number];
/** A rigid placement: origin and three unit axes (columns), in the file's length unit. */
export interface Frame {
  origin: Vec3;
  x: Vec3;
  y: Vec3;
  z: Vec3;
}

export const identity: Frame = { origin: [0, 0, 0], x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] };

export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const scale = (a: Vec3, k: number): Vec3 => [a[0] * k, a[1] * k, a[2] * k];
export const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const length = (a: Vec3) => Math.hypot(a[0], a[1], a[2]);
export const unit = (a: Vec3): Vec3 => scale(a, 1 / length(a));
export const distance = (a: Vec3, b: Vec3) => length(sub(a, b));

/** Point given in `frame`'s coordinates, in the parent's coordinates. */
export const applyPoint = (f: Frame, p: Vec3): Vec3 => add(f.origin, applyVector(f, p));
export const applyVector = (f: Frame, v: Vec3): Vec3 => add(add(scale(f.x, v[0]), scale(f.y, v[1])), scale(f.z, v[2]));
/** `inner` expressed in `outer`'s parent coordinates. */
export const compose = (outer: Frame, inner: Frame): Frame => ({
  origin: applyPoint(outer, inner.origin),
  x: applyVector(outer, inner.x),
  y: applyVector(outer, inner.y),
  z: applyVector(outer, inner.z),
});

function vec3(values: number[], fallback: Vec3): Vec3 {
  if (values.length < 2 || values.some((v) => !Number.isFinite(v))) return fallback;
  return [values[0], values[1], values[2] ?? 0];
}

/** IfcCartesianPoint coordinates (2D points get z = 0). */
export const pointOf = (reader: IfcReader, id: number | undefined): Vec3 | undefined => {
  const line = id === undefined ? undefined : reader.line(id);
  const values = nums(line?.Coordinates);
  return values.length >= 2 && values.every(Number.isFinite) ? [values[0], values[1], values[2] ?? 0] : undefined;
};

/** IfcDirection ratios, normalised. */
export const directionOf = (reader: IfcReader, id: number | undefined, fallback: Vec3): Vec3 => {
  const line = id === undefined ? undefined : reader.line(id);
  const v = vec3(nums(line?.DirectionRatios), fallback);
  return length(v) > 0 ? unit(v) : fallback;
};

/** IfcAxis2Placement3D / IfcAxis2Placement2D as a frame (the x axis is made orthogonal to z, as IFC prescribes). */
export function axisPlacement(reader: IfcReader, id: number | undefined): Frame {
  const line = id === undefined ? undefined : reader.line(id);
  if (!line) return identity;
  const origin = pointOf(reader, refId(line.Location)) ?? [0, 0, 0];
  const z = directionOf(reader, refId(line.Axis), [0, 0, 1]);
  const ref = directionOf(reader, refId(line.RefDirection), Math.abs(z[0]) > 0.9 ? [0, 1, 0] : [1, 0, 0]);
  const x = unit(sub(ref, scale(z, dot(ref, z))));
  return { origin, x, y: cross(z, x), z };
}

/** World frame of an IfcLocalPlacement chain (PlacementRelTo followed to the root; cycles stop the walk). */
export function objectPlacement(reader: IfcReader, id: number | undefined): Frame {
  const chain: Frame[] = [];
  const seen = new Set<number>();
  let current = id;
  while (current !== undefined && !seen.has(current) && chain.length < 64) {
    seen.add(current);
    const line = reader.line(current);
    if (!line) break;
    chain.push(axisPlacement(reader, refId(line.RelativePlacement)));
    current = refId(line.PlacementRelTo);
  }
  return chain.reduceRight((outer, inner) => compose(outer, inner), identity);
}
