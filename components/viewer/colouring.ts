// Pure colour and thickness mapping for members, read from one result's columns (typed arrays in member order,
// lib/models/result-columns.ts): no member is looked up by id. The mesh layer copies the arrays returned here
// straight into the instance buffers, so switching result or colouring never rebuilds geometry.
import { bitAt, VERDICT_CODES, type WireColumns } from "@/lib/models/result-columns";
import { deltaForceScale, memberLook, palette, utilisationScale, verdictColours } from "./config";
import type { MemberVerdict } from "./types";
import { FORCE_STATE_LABELS, forceStateOf, type ForceState } from "@/lib/vocabulary/force-state";

export type ColourMode = "forceState" | "magnitude" | "utilisation" | "zeroInAll" | "verdict" | "compare" | "deltaForce";
export type Rgb = readonly [number, number, number];

export const colourModeLabels: Record<ColourMode, string> = {
  forceState: "Force state",
  magnitude: "Axial force (kN)",
  utilisation: "Utilisation",
  zeroInAll: "Zero in every case and combination",
  verdict: "Member verdict",
  compare: "Change of state between two results",
  deltaForce: "Change of axial force ΔN between two results",
};

/** The colourings that read a second result (the one compared with). */
export function comparesTwoResults(mode: ColourMode): boolean {
  return mode === "compare" || mode === "deltaForce";
}

/**
 * Whether a change of force counts as none: the zero-force rule of design.md ("The model format") applied to ΔN,
 * |ΔN| <= 1e-6 x the largest |ΔN| or <= 1e-9 kN, so Float32 noise between two results is not a change.
 */
export function isNoChange(delta: number, largestAbsDelta: number): boolean {
  return Math.abs(delta) <= Math.max(1e-9, 1e-6 * largestAbsDelta);
}

/** Diverging ΔN scale: the fall colour at -max, the neutral tint at 0, the rise colour at +max. */
export function deltaForceColour(delta: number, largestAbsDelta: number): Rgb {
  const neutral = hexToRgb(palette.neutral);
  if (isNoChange(delta, largestAbsDelta)) return neutral;
  return mixRgb(neutral, hexToRgb(delta > 0 ? deltaForceScale.rise : deltaForceScale.fall), Math.abs(delta) / largestAbsDelta);
}

/** Largest |N(a) − N(b)| over the members (0 when nothing changed). */
export function largestAbsDelta(a: Float32Array, b: Float32Array): number {
  let max = 0;
  for (let k = 0; k < a.length; k += 1) max = Math.max(max, Math.abs(a[k] - b[k]));
  return max;
}

/** State codes stored per member in a Uint8Array. */
export const STATE_CODE = { tension: 0, compression: 1, "zero-force": 2 } as const satisfies Record<ForceState, number>;
const STATE_BY_CODE: ForceState[] = ["tension", "compression", "zero-force"];

/** Parses "#rrggbb" into linear-free 0..1 sRGB components. */
export function hexToRgb(hex: string): Rgb {
  const value = Number.parseInt(hex.slice(1), 16);
  return [((value >> 16) & 255) / 255, ((value >> 8) & 255) / 255, (value & 255) / 255];
}

/** Linear blend of two colours, t = 0 gives a, t = 1 gives b. */
export function mixRgb(a: Rgb, b: Rgb, t: number): Rgb {
  const k = Math.min(1, Math.max(0, t));
  return [a[0] + (b[0] - a[0]) * k, a[1] + (b[1] - a[1]) * k, a[2] + (b[2] - a[2]) * k];
}

/** What the colourings read of a result: its columns (forces, zero bits, and the run's review columns). */
export type ResultColumnsView = Pick<WireColumns, "memberCount" | "forces" | "zero" | "zeroInAll" | "utilisation" | "verdicts" | "hasReview">;

/** Force state code of every member, in member order. */
export function forceStates(columns: ResultColumnsView): Uint8Array {
  const states = new Uint8Array(columns.memberCount);
  for (let k = 0; k < columns.memberCount; k += 1) states[k] = STATE_CODE[forceStateOf(columns.forces[k], bitAt(columns.zero, k) === 1)];
  return states;
}

export type StateCounts = Record<ForceState, number>;

/** How many members are in tension, compression and zero-force (only those marked 1 in `shown`, when given). */
export function countStates(states: Uint8Array, shown?: Uint8Array): StateCounts {
  const counts: StateCounts = { tension: 0, compression: 0, "zero-force": 0 };
  for (let k = 0; k < states.length; k += 1) if (!shown || shown[k] === 1) counts[STATE_BY_CODE[states[k]]] += 1;
  return counts;
}

/** Largest |N| of a result over its members (0 when every member is zero). */
export function maxAbsForce(forces: Float32Array): number {
  let max = 0;
  for (let k = 0; k < forces.length; k += 1) max = Math.max(max, Math.abs(forces[k]));
  return max;
}

/** Member radius in model units: thin when zero-force, growing with sqrt(|N|/max) so area tracks force. */
export function memberRadius(force: number, maxAbs: number, isZero: boolean, unitLength: number): number {
  if (isZero || maxAbs <= 0) return memberLook.zeroRadius * unitLength;
  const share = Math.sqrt(Math.min(1, Math.abs(force) / maxAbs));
  return (memberLook.minRadius + (memberLook.maxRadius - memberLook.minRadius) * share) * unitLength;
}

/** Diverging scale: compression colour at -max, pale neutral at 0, tension colour at +max. */
export function divergingColour(force: number, maxAbs: number): Rgb {
  const neutral = hexToRgb(palette.neutral);
  if (maxAbs <= 0) return neutral;
  const t = Math.min(1, Math.abs(force) / maxAbs);
  return mixRgb(neutral, hexToRgb(force >= 0 ? palette.tension : palette.compression), t);
}

/** Sequential utilisation scale 0..1, with a separate warning colour above 1. */
export function utilisationColour(utilisation: number): Rgb {
  if (utilisation > 1) return hexToRgb(utilisationScale.over);
  return mixRgb(hexToRgb(utilisationScale.low), hexToRgb(utilisationScale.high), Math.max(0, utilisation));
}

// The force-state colours, parsed once: every member of a colouring reads one of these five.
const STATE_RGB: Record<ForceState, Rgb> = { tension: hexToRgb(palette.tension), compression: hexToRgb(palette.compression), "zero-force": hexToRgb(palette.zeroForce) };
const LOW_STATE_RGB: Record<ForceState, Rgb> = {
  tension: mixRgb([1, 1, 1], STATE_RGB.tension, memberLook.lowForceTint),
  compression: mixRgb([1, 1, 1], STATE_RGB.compression, memberLook.lowForceTint),
  "zero-force": STATE_RGB["zero-force"],
};
const LOW_STATE_KEY: Record<ForceState, string> = { tension: "low-tension", compression: "low-compression", "zero-force": "low-zero-force" };

/** Force-state colour, paled towards white for a low-force member (below the user's threshold). */
export function stateColour(state: ForceState, lowForce: boolean): Rgb {
  return lowForce ? LOW_STATE_RGB[state] : STATE_RGB[state];
}

export interface LegendEntry { key: string; label: string; colour: string; count: number }
export interface LegendScale { min: number; max: number; unit: string; fromColour: string; midColour?: string; toColour: string }
export interface Legend {
  title: string;
  resultLabel: string;
  counts: StateCounts;
  entries: LegendEntry[];
  scale?: LegendScale;
  /** A line under the entries (the comparison's largest change of force). */
  note?: string;
  /** Members counted (those the filters let through) and in the model: the counts cover only what is drawn. */
  members: { counted: number; total: number };
}

export interface AppearanceInput {
  columns: ResultColumnsView;
  resultLabel: string;
  mode: ColourMode;
  unitLength: number;
  /** |N| below this (kN) and not zero-force: drawn as low-force. 0 turns the tint off. */
  lowForceThreshold: number;
  /** The other result for the colourings that compare two (comparesTwoResults): the change is from it to the chosen result. */
  compareColumns?: ResultColumnsView;
  compareLabel?: string;
  /** Member ids in column order, to name the member of the largest change when comparing. */
  memberIds?: readonly string[];
  /** 1 per member the filters let through (filters.ts visibleMask); the legend counts only these. All when absent. */
  shown?: Uint8Array;
}

export interface MemberAppearance {
  colours: Float32Array;
  radii: Float32Array;
  /** 1 = drawn in the thin translucent layer. */
  translucent: Uint8Array;
  states: Uint8Array;
  legend: Legend;
}

const rgbToHex = (rgb: Rgb) =>
  `#${rgb.map((c) => Math.round(c * 255).toString(16).padStart(2, "0")).join("")}`;

/** Colours, radii and legend for every member under one colouring of one result (counting only the shown ones). */
export function computeAppearance(input: AppearanceInput): MemberAppearance {
  const { columns, mode, unitLength, shown } = input;
  const count = columns.memberCount;
  const states = forceStates(columns);
  const counts = countStates(states, shown);
  const maxAbs = maxAbsForce(columns.forces);
  const colours = new Float32Array(count * 3);
  const radii = new Float32Array(count);
  const translucent = new Uint8Array(count);
  const compareStates = mode === "compare" && input.compareColumns ? forceStates(input.compareColumns) : null;
  const maxDelta = mode === "deltaForce" && input.compareColumns ? largestAbsDelta(columns.forces, input.compareColumns.forces) : 0;
  // Largest change of axial force between the two results (member index and N(chosen) − N(compared), kN).
  let largestChange = { k: -1, delta: 0 };
  const tally = new Map<string, number>();
  let counted = 0;

  let isShown = true;
  const bump = (key: string) => {
    if (isShown) tally.set(key, (tally.get(key) ?? 0) + 1);
  };
  for (let k = 0; k < count; k += 1) {
    // Every member gets its colour (a filter change only moves matrices), but only the shown ones are counted.
    isShown = !shown || shown[k] === 1;
    if (isShown) counted += 1;
    const force = columns.forces[k];
    const state = STATE_BY_CODE[states[k]];
    const isZero = state === "zero-force";
    radii[k] = memberRadius(force, maxAbs, isZero, unitLength);
    translucent[k] = isZero ? 1 : 0;
    let colour: Rgb;
    switch (mode) {
      case "forceState": {
        const low = !isZero && Math.abs(force) < input.lowForceThreshold;
        colour = stateColour(state, low);
        bump(low ? LOW_STATE_KEY[state] : state);
        break;
      }
      case "magnitude":
        colour = isZero ? hexToRgb(palette.zeroForce) : divergingColour(force, maxAbs);
        break;
      case "utilisation": {
        // NaN: no check (never carries force, or no review).
        const u = columns.utilisation[k];
        colour = Number.isNaN(u) ? hexToRgb(palette.zeroForce) : utilisationColour(u);
        bump(Number.isNaN(u) ? "none" : u > 1 ? "over" : u >= 0.9 ? "high" : "ok");
        break;
      }
      case "zeroInAll": {
        const always = bitAt(columns.zeroInAll, k) === 1;
        colour = hexToRgb(always ? palette.zeroForce : palette.member);
        translucent[k] = always ? 1 : 0;
        if (always) radii[k] = memberLook.zeroRadius * unitLength;
        bump(always ? "always" : "some");
        break;
      }
      case "verdict": {
        const code = columns.verdicts[k];
        const verdict: MemberVerdict | undefined = code > 0 ? VERDICT_CODES[code - 1] : undefined;
        colour = hexToRgb(verdict ? verdictColours[verdict] : palette.zeroForce);
        translucent[k] = 0;
        bump(verdict ?? "none");
        break;
      }
      case "compare": {
        const changed = compareStates !== null && compareStates[k] !== states[k];
        const delta = input.compareColumns ? force - input.compareColumns.forces[k] : 0;
        if (isShown && Math.abs(delta) > Math.abs(largestChange.delta)) largestChange = { k, delta };
        colour = changed ? stateColour(state, false) : hexToRgb(palette.filteredOut);
        translucent[k] = changed ? 0 : 1;
        if (changed) bump(`to-${state}`);
        else bump("same");
        break;
      }
      case "deltaForce": {
        const delta = input.compareColumns ? force - input.compareColumns.forces[k] : 0;
        if (isShown && Math.abs(delta) > Math.abs(largestChange.delta)) largestChange = { k, delta };
        const same = isNoChange(delta, maxDelta);
        colour = deltaForceColour(delta, maxDelta);
        translucent[k] = same ? 1 : 0;
        bump(same ? "same" : delta > 0 ? "rise" : "fall");
        break;
      }
    }
    colours[k * 3] = colour[0];
    colours[k * 3 + 1] = colour[1];
    colours[k * 3 + 2] = colour[2];
  }

  const legend = buildLegend(input, counts, tally, mode === "deltaForce" ? maxDelta : maxAbs, { counted, total: count });
  if (comparesTwoResults(mode) && largestChange.k >= 0 && input.memberIds) {
    const d = largestChange.delta;
    legend.note = `Largest change of force: ${input.memberIds[largestChange.k]}, ${d > 0 ? "+" : "−"}${Math.abs(d).toFixed(1)} kN`;
  }
  return { colours, radii, translucent, states, legend };
}

/**
 * The legend of a colouring; `maxAbs` is the scale's end: the largest |N|, or the largest |ΔN| when comparing
 * forces. `members` says how many members the counts cover (those the filters let through) of all.
 */
function buildLegend(input: AppearanceInput, counts: StateCounts, tally: Map<string, number>, maxAbs: number, members: Legend["members"]): Legend {
  const n = (key: string) => tally.get(key) ?? 0;
  const base = { title: colourModeLabels[input.mode], resultLabel: input.resultLabel, counts, members };
  const hex = (rgb: Rgb) => rgbToHex(rgb);
  switch (input.mode) {
    case "forceState": {
      const entries: LegendEntry[] = [
        { key: "tension", label: FORCE_STATE_LABELS.tension, colour: palette.tension, count: n("tension") },
        { key: "compression", label: FORCE_STATE_LABELS.compression, colour: palette.compression, count: n("compression") },
        { key: "zero-force", label: FORCE_STATE_LABELS["zero-force"], colour: palette.zeroForce, count: n("zero-force") },
      ];
      if (input.lowForceThreshold > 0) {
        entries.push(
          { key: "low-tension", label: `Low-force tension (< ${input.lowForceThreshold} kN)`, colour: hex(stateColour("tension", true)), count: n("low-tension") },
          { key: "low-compression", label: `Low-force compression (< ${input.lowForceThreshold} kN)`, colour: hex(stateColour("compression", true)), count: n("low-compression") },
        );
      }
      return { ...base, entries };
    }
    case "magnitude":
      return {
        ...base,
        entries: [{ key: "zero-force", label: FORCE_STATE_LABELS["zero-force"], colour: palette.zeroForce, count: counts["zero-force"] }],
        scale: { min: -maxAbs, max: maxAbs, unit: "kN", fromColour: palette.compression, midColour: palette.neutral, toColour: palette.tension },
      };
    case "utilisation":
      return {
        ...base,
        entries: [
          { key: "ok", label: "Below 0.9", colour: hex(utilisationColour(0.45)), count: n("ok") },
          { key: "high", label: "0.9 to 1.0", colour: hex(utilisationColour(0.95)), count: n("high") },
          { key: "over", label: "Over 1.0", colour: utilisationScale.over, count: n("over") },
          { key: "none", label: "No check", colour: palette.zeroForce, count: n("none") },
        ],
        scale: { min: 0, max: 1, unit: "", fromColour: utilisationScale.low, toColour: utilisationScale.high },
      };
    case "zeroInAll":
      return {
        ...base,
        entries: [
          { key: "always", label: "Zero in every case and combination", colour: palette.zeroForce, count: n("always") },
          { key: "some", label: "Carries force somewhere", colour: palette.member, count: n("some") },
        ],
      };
    case "verdict":
      return {
        ...base,
        entries: (Object.keys(verdictColours) as MemberVerdict[])
          .map((v): LegendEntry => ({ key: v, label: v.charAt(0).toUpperCase() + v.slice(1), colour: verdictColours[v], count: n(v) }))
          .concat(n("none") > 0 ? [{ key: "none", label: "No verdict", colour: palette.zeroForce, count: n("none") }] : []),
      };
    case "compare":
      return {
        ...base,
        title: `Change from ${input.compareLabel ?? "?"} to ${input.resultLabel}`,
        entries: [
          { key: "to-tension", label: "Now tension", colour: palette.tension, count: n("to-tension") },
          { key: "to-compression", label: "Now compression", colour: palette.compression, count: n("to-compression") },
          { key: "to-zero-force", label: "Now zero-force", colour: palette.zeroForce, count: n("to-zero-force") },
          { key: "same", label: "Unchanged", colour: palette.filteredOut, count: n("same") },
        ],
      };
    case "deltaForce":
      return {
        ...base,
        title: `ΔN from ${input.compareLabel ?? "?"} to ${input.resultLabel}`,
        entries: [
          { key: "rise", label: "ΔN > 0: towards tension", colour: deltaForceScale.rise, count: n("rise") },
          { key: "fall", label: "ΔN < 0: towards compression", colour: deltaForceScale.fall, count: n("fall") },
          { key: "same", label: "No change", colour: palette.neutral, count: n("same") },
        ],
        scale: { min: -maxAbs, max: maxAbs, unit: "kN", fromColour: deltaForceScale.fall, midColour: palette.neutral, toColour: deltaForceScale.rise },
      };
  }
}
