// Per-member design checks across results: the inputs from the model and the governing check per member.
import { DEFAULT_FABRICATION, ultimateStrength, type AnalysisResult, type TrussModel } from "@/lib/analysis";
import { checkAxialForce, resistanceTable, tableResistance, tableUtilisation, type ResistanceTable } from "./design-checks/member-check";
import type { AxialCheck, ChsFabrication, DesignMethod, DesignStandard, MemberDesignInput } from "./design-checks/types";

export type DesignOptions = {
  standard: DesignStandard;
  /** AISC only: LRFD (default) or ASD. */
  method?: DesignMethod;
  /** Fabrication of sections that state none; the model format's default (cold-formed) unless told. */
  fabrication?: ChsFabrication;
};

/** One member's check under one result: compact, so whole-model reviews stay small. */
export type ResultCheck = { result: string; force: number; mode: AxialCheck["mode"]; resistance: number; utilisation: number };

export type MemberDesign = {
  member: string;
  checks: ResultCheck[];
  /** The check with the largest utilisation, with its full arithmetic; null when the member never carries force. */
  governing: (AxialCheck & { result: string }) | null;
  warnings: string[];
};

/**
 * The results a resistance check ranges over: the ultimate combinations, or the load cases (unfactored) when
 * the model has none. Serviceability combinations are checked for deflection only (deflection.ts).
 */
export function designResultIds(model: TrussModel): string[] {
  const ultimate = model.combinations.filter((c) => (c.kind ?? "ultimate") === "ultimate");
  return ultimate.length > 0 ? ultimate.map((c) => c.id) : model.combinations.length > 0 ? [] : model.loadCases.map((c) => c.id);
}

/** Design inputs (model units) per member, in model member order. Length from the node coordinates. */
export function memberDesignInputs(model: TrussModel, options: Omit<DesignOptions, "standard"> = {}): MemberDesignInput[] {
  const nodes = new Map(model.nodes.map((n) => [n.id, n]));
  const materials = new Map(model.materials.map((m) => [m.id, m]));
  const sections = new Map(model.sections.map((s) => [s.id, s]));
  const strengths = new Map(model.materials.map((m) => [m.id, ultimateStrength(m)]));
  return model.members.map((member) => {
    const a = nodes.get(member.i)!;
    const b = nodes.get(member.j)!;
    const section = sections.get(member.section)!;
    const material = materials.get(section.material)!;
    const { fu, source } = strengths.get(material.id)!;
    return {
      length: Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z),
      area: section.area,
      radiusOfGyration: section.radiusOfGyration,
      E: material.E,
      fy: material.fy,
      fu,
      fuSource: source,
      effectiveLengthFactor: member.effectiveLengthFactor ?? 1,
      fabrication: section.fabrication ?? options.fabrication ?? DEFAULT_FABRICATION,
      fabricationDefaulted: section.fabrication === undefined,
      method: options.method,
      outerDiameter: section.outerDiameter > 0 ? section.outerDiameter : undefined,
      wallThickness: section.wallThickness > 0 ? section.wallThickness : undefined,
    };
  });
}

/** Checks every member under every design result; keeps the governing check's arithmetic. */
export function designMembers(model: TrussModel, result: AnalysisResult, options: DesignOptions): MemberDesign[] {
  const inputs = memberDesignInputs(model, options);
  const table = resistanceTable(options.standard, inputs);
  const ids = designResultIds(model).filter((id) => result.results[id]);
  const zero = ids.map((id) => new Set(result.results[id].zeroForceMembers));
  return model.members.map((member, e) => {
    const checks = ids.map((id, k): ResultCheck => {
      // A zero-force member's rounding-level force is no force at all.
      const force = zero[k].has(member.id) ? 0 : result.results[id].memberForces[member.id];
      const mode = force > 0 ? "tension" : force < 0 ? "compression" : "none";
      return { result: id, force, mode, resistance: tableResistance(table, e, force), utilisation: tableUtilisation(table, e, force) };
    });
    const worst = checks.reduce<ResultCheck | null>((g, c) => (c.mode !== "none" && (g === null || c.utilisation > g.utilisation) ? c : g), null);
    const governing = worst ? { result: worst.result, ...checkAxialForce(options.standard, inputs[e], worst.force) } : null;
    // Slenderness and wall warnings of every sign the member sees, not only the governing one.
    const warnings = new Set(governing?.warnings ?? []);
    for (const mode of ["tension", "compression"] as const) {
      const c = checks.find((x) => x.mode === mode);
      if (c && c.mode !== governing?.mode) for (const w of checkAxialForce(options.standard, inputs[e], c.force).warnings) warnings.add(w);
    }
    return { member: member.id, checks, governing, warnings: [...warnings] };
  });
}

/** Largest utilisation per member (index order) over the given force sets: the fast path for what-ifs. */
export function governingUtilisations(table: ResistanceTable, forceSets: Float64Array[], skip?: Uint8Array): Float64Array {
  const out = new Float64Array(table.tension.length);
  for (let e = 0; e < out.length; e++) {
    if (skip?.[e]) continue;
    let worst = 0;
    for (const forces of forceSets) worst = Math.max(worst, tableUtilisation(table, e, forces[e]));
    out[e] = worst;
  }
  return out;
}
