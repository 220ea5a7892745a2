// Pure colour mapping for the influence map of one member: how much force a 1 kN downward load at each top-layer
// node puts into it. Diverging and symmetric about zero, so equal colours mean equal kN/kN of either sign:
// tension-producing nodes in the tension colour, compression-producing ones in the compression colour, nodes whose
// load leaves the member (nearly) unloaded in the zero-force slate.
import { hexToRgb, mixRgb, type Rgb } from "./colouring";
import { palette } from "./config";

/** One node's influence value: kN in the member (tension positive) per 1 kN downward at the node. */
export interface InfluenceValue { node: string; value: number }

export interface InfluenceLegend {
  title: string;
  unit: "kN/kN";
  /** Smallest and largest value over the nodes (the range shown). */
  min: number;
  max: number;
  /** The scale runs from −scaleMax (full compression colour) to +scaleMax (full tension colour). */
  scaleMax: number;
  fromColour: string;
  midColour: string;
  toColour: string;
}

/** Colour of one value on the scale −scaleMax … 0 … +scaleMax (slate at zero, and everywhere when scaleMax is 0). */
export function influenceColour(value: number, scaleMax: number): Rgb {
  const zero = hexToRgb(palette.zeroForce);
  if (!(scaleMax > 0)) return zero;
  return mixRgb(zero, hexToRgb(value >= 0 ? palette.tension : palette.compression), Math.abs(value) / scaleMax);
}

/** Largest |value| over the nodes: the half-width of the symmetric scale. */
export function influenceScaleMax(values: readonly InfluenceValue[]): number {
  let max = 0;
  for (const v of values) max = Math.max(max, Math.abs(v.value));
  return max;
}

/** RGB triples (0..1) for every node in order, ready to copy into an instance colour buffer. */
export function influenceColours(values: readonly InfluenceValue[]): Float32Array {
  const scaleMax = influenceScaleMax(values);
  const out = new Float32Array(values.length * 3);
  values.forEach((v, k) => out.set(influenceColour(v.value, scaleMax), k * 3));
  return out;
}

/** What the legend says about the influence map of `member`: the title, the range of values and the scale ends. */
export function influenceLegend(member: string, values: readonly InfluenceValue[]): InfluenceLegend {
  let min = values.length ? Infinity : 0;
  let max = values.length ? -Infinity : 0;
  for (const v of values) {
    min = Math.min(min, v.value);
    max = Math.max(max, v.value);
  }
  return {
    title: `Force in ${member} per 1 kN downward at each top node, kN/kN`,
    unit: "kN/kN",
    min,
    max,
    scaleMax: influenceScaleMax(values),
    fromColour: palette.compression,
    midColour: palette.zeroForce,
    toColour: palette.tension,
  };
}

/** A kN/kN value for the legend, with a real minus sign and no "−0.000". */
export function formatInfluence(value: number): string {
  const text = Math.abs(value).toFixed(3);
  return Number(text) === 0 ? "0.000" : `${value < 0 ? "−" : ""}${text}`;
}
