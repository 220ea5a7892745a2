import { z } from "zod";
import { ids, modelCounts, physical, text as limitText } from "../limits";
import { findUnstorableText, isStorableText, RESERVED_NAMES, reservedNameMessage, UNSTORABLE_TEXT_MESSAGE } from "../text";

/** Load case categories of the model format (ours, version 1). */
export const loadCategories = ["dead", "live", "roof_live", "snow", "wind", "services", "other"] as const;
export type LoadCategory = (typeof loadCategories)[number];

// zod 4's z.number() already refuses NaN and +-Infinity, so "non-finite number" problems come from here.
const id = z
  .string()
  .min(1, "id must not be empty")
  .max(ids.elementIdChars, `ids are at most ${ids.elementIdChars} characters`)
  .refine(isStorableText, UNSTORABLE_TEXT_MESSAGE)
  .refine((value) => !RESERVED_NAMES.has(value), { error: (issue) => reservedNameMessage(String(issue.input)) });
const num = z.number();
const name = z.string().max(limitText.name, `names are at most ${limitText.name} characters`).refine(isStorableText, UNSTORABLE_TEXT_MESSAGE);

/** How a hollow section was made: hot finished (EN 10210) or cold formed (EN 10219, ERW HSS). */
export const fabrications = ["hot-finished", "cold-formed"] as const;
export type Fabrication = (typeof fabrications)[number];
/** Stated default when a section gives none: cold formed, the conservative choice for both standards. */
export const DEFAULT_FABRICATION: Fabrication = "cold-formed";

export const materialSchema = z.object({
  id,
  E: num,
  fy: num,
  unitWeight: num,
  /** Ultimate tensile strength, kPa. Optional: when absent the usual value of the grade is used (grades.ts). */
  fu: num.optional(),
});
export const sectionSchema = z.object({
  id,
  material: id,
  area: num,
  radiusOfGyration: num,
  outerDiameter: num,
  wallThickness: num,
  /** Optional; cold-formed when absent (DEFAULT_FABRICATION). */
  fabrication: z.enum(fabrications).optional(),
});
export const nodeSchema = z.object({ id, x: num, y: num, z: num });
export const memberSchema = z.object({
  id,
  i: id,
  j: id,
  section: id,
  /** Buckling length factor K for design checks (Lc = K L); 1.0 when absent. */
  effectiveLengthFactor: num.optional(),
});
export const supportSchema = z.object({ node: id, ux: z.boolean(), uy: z.boolean(), uz: z.boolean() });
export const nodalLoadSchema = z.object({ node: id, fx: num, fy: num, fz: num });
export const loadCaseSchema = z.object({
  id,
  name,
  category: z.enum(loadCategories),
  selfWeight: z.boolean(),
  nodalLoads: z.array(nodalLoadSchema),
});
/** Ultimate combinations are checked for resistance, serviceability ones for deflection only. */
export const combinationKinds = ["ultimate", "serviceability"] as const;
export const combinationSchema = z.object({
  id,
  name,
  factors: z.record(z.string(), num),
  /** Optional; ultimate when absent. */
  kind: z.enum(combinationKinds).optional(),
});

/** The truss model format, version 1 (units m, kN, kPa, kN/m3; z up). */
export const trussModelSchema = z.object({
  format: z.literal("truss-model/1"),
  name,
  materials: z.array(materialSchema),
  sections: z.array(sectionSchema),
  nodes: z.array(nodeSchema),
  members: z.array(memberSchema),
  supports: z.array(supportSchema),
  loadCases: z.array(loadCaseSchema),
  combinations: z.array(combinationSchema),
});

export type TrussModel = z.infer<typeof trussModelSchema>;

// The same shape with every bad field (or row) replaced by a neutral stand-in: after a failed parse it lets the
// cross-reference checks still run, so one wrong type does not hide the other problems.
const anyId = z.string().catch("");
const anyNum = z.number().catch(0);
const anyFlag = z.boolean().catch(false);
const salvageRow = <T extends z.ZodObject>(row: T) => row.catch(row.parse({}));
const salvageSchema = z.object({
  format: z.literal("truss-model/1").catch("truss-model/1"),
  name: z.string().catch(""),
  materials: z.array(salvageRow(z.object({ id: anyId, E: z.number().catch(1), fy: anyNum, unitWeight: anyNum, fu: z.number().optional().catch(undefined) }))),
  sections: z.array(
    salvageRow(
      z.object({
        id: anyId,
        material: anyId,
        area: z.number().catch(1),
        radiusOfGyration: anyNum,
        outerDiameter: anyNum,
        wallThickness: anyNum,
        fabrication: z.enum(fabrications).optional().catch(undefined),
      }),
    ),
  ),
  nodes: z.array(salvageRow(z.object({ id: anyId, x: anyNum, y: anyNum, z: anyNum }))),
  members: z.array(salvageRow(z.object({ id: anyId, i: anyId, j: anyId, section: anyId, effectiveLengthFactor: z.number().optional().catch(undefined) }))),
  supports: z.array(salvageRow(z.object({ node: anyId, ux: anyFlag, uy: anyFlag, uz: anyFlag }))),
  loadCases: z.array(
    salvageRow(
      z.object({
        id: anyId,
        name: z.string().catch(""),
        category: z.enum(loadCategories).catch("other"),
        selfWeight: anyFlag,
        nodalLoads: z.array(salvageRow(z.object({ node: anyId, fx: anyNum, fy: anyNum, fz: anyNum }))).catch([]),
      }),
    ),
  ),
  combinations: z.array(
    salvageRow(z.object({ id: anyId, name: z.string().catch(""), factors: z.record(z.string(), anyNum).catch({}), kind: z.enum(combinationKinds).optional().catch(undefined) })),
  ),
});

export type TrussMaterial = z.infer<typeof materialSchema>;
export type TrussSection = z.infer<typeof sectionSchema>;
export type TrussNode = z.infer<typeof nodeSchema>;
export type TrussMember = z.infer<typeof memberSchema>;
export type TrussSupport = z.infer<typeof supportSchema>;
export type LoadCase = z.infer<typeof loadCaseSchema>;
export type NodalLoad = z.infer<typeof nodalLoadSchema>;
export type Combination = z.infer<typeof combinationSchema>;

export type ModelProblem = { where: string; message: string };
export type ValidationResult = { ok: true; model: TrussModel } | { ok: false; problems: ModelProblem[] };

type Table = keyof Omit<TrussModel, "format" | "name">;

/**
 * Names a model record for problem messages: `members[3] "M7"` for JSON, `members.csv line 5 (M7)` for CSV.
 * `load` is the index of a nodal load inside load case `index`.
 */
export type Locator = (table: Table, index: number, load?: number) => string;

/** Locator for JSON input; reads the raw rows defensively because it also names rows that failed to parse. */
export const jsonLocator =
  (input: unknown): Locator =>
  (table, index, load) => {
    const rows = (input as Record<string, unknown> | null)?.[table];
    const row = Array.isArray(rows) ? (rows[index] as { id?: unknown; node?: unknown } | undefined) : undefined;
    const label = typeof row?.id === "string" && row.id !== "" ? row.id : typeof row?.node === "string" && row.node !== "" ? row.node : undefined;
    const base = label === undefined ? `${table}[${index}]` : `${table}[${index}] "${label}"`;
    return load === undefined ? base : `${base} nodalLoads[${load}]`;
  };

const tables = new Set<string>(["materials", "sections", "nodes", "members", "supports", "loadCases", "combinations"]);

/** Validates raw input against the model format and its cross-references; lists every problem found. */
export function validateModel(input: unknown, locate: Locator = jsonLocator(input)): ValidationResult {
  // Counted first: a model beyond the limits is refused without checking (or analysing) any of its rows.
  const tooMany = countProblems(input);
  if (tooMany.length) return { ok: false, problems: tooMany };
  // zod drops "__proto__" keys without a word (a factor would vanish): refused here with null characters and the like.
  const unstorable = findUnstorableText(input);
  if (unstorable.length) return { ok: false, problems: unstorable.map((p) => ({ where: describePath(p.path, locate), message: p.message })) };
  const parsed = trussModelSchema.safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => ({
      where: describePath(issue.path, locate),
      message: issue.code === "invalid_type" && issue.expected === "number" ? `${issue.message} (numbers must be finite)` : issue.message,
    }));
    const salvaged = salvageSchema.safeParse(input);
    // only when every table is at least a list: otherwise each reference would look missing
    if (salvaged.success) {
      // Only the links between rows are checked on the salvaged model (its stand-in values would make range checks
      // noise), and a link is skipped only when its own field, the row's id or the whole row is already flagged:
      // a section whose area is text still reports its missing material (issue 17 item 13).
      const flagged = new Set(problems.map((p) => p.where));
      for (const link of checkLinks(salvaged.data, locate)) {
        if (![link.where, `${link.where} id`, `${link.where} ${link.field}`].some((w) => flagged.has(w))) problems.push({ where: link.where, message: link.message });
      }
    }
    return { ok: false, problems };
  }
  const problems = checkReferences(parsed.data, locate);
  return problems.length === 0 ? { ok: true, model: parsed.data } : { ok: false, problems };
}

function countProblems(input: unknown): ModelProblem[] {
  if (input === null || typeof input !== "object") return [];
  const problems: ModelProblem[] = [];
  const record = input as Record<string, unknown>;
  const limit = (table: Table, max: number) => {
    const rows = record[table];
    if (Array.isArray(rows) && rows.length > max) {
      problems.push({ where: table, message: `${rows.length.toLocaleString("en")} ${table}: a model may have at most ${max.toLocaleString("en")}` });
    }
  };
  limit("nodes", modelCounts.nodes);
  limit("members", modelCounts.members);
  limit("materials", modelCounts.materials);
  limit("sections", modelCounts.sections);
  limit("supports", modelCounts.supports);
  limit("loadCases", modelCounts.loadCases);
  limit("combinations", modelCounts.combinations);
  const cases = record.loadCases;
  if (Array.isArray(cases)) {
    let loads = 0;
    for (const c of cases) {
      const rows = (c as { nodalLoads?: unknown } | null)?.nodalLoads;
      if (Array.isArray(rows)) loads += rows.length;
    }
    if (loads > modelCounts.nodalLoads) {
      problems.push({ where: "loadCases", message: `${loads.toLocaleString("en")} nodal loads: a model may have at most ${modelCounts.nodalLoads.toLocaleString("en")}` });
    }
  }
  const combinations = record.combinations;
  if (Array.isArray(combinations)) {
    combinations.forEach((c, k) => {
      const factors = (c as { factors?: unknown } | null)?.factors;
      const count = factors !== null && typeof factors === "object" ? Object.keys(factors).length : 0;
      if (count > modelCounts.factorsPerCombination) {
        problems.push({ where: `combinations[${k}]`, message: `${count} factors: a combination may have at most ${modelCounts.factorsPerCombination}` });
      }
    });
  }
  return problems;
}

/** A problem when |value| is beyond the limit, or outside [min, max]. */
function outside(value: number, range: number | { min: number; max: number }): boolean {
  return typeof range === "number" ? Math.abs(value) > range : value < range.min || value > range.max;
}

function describePath(path: PropertyKey[], locate: Locator): string {
  const [table, index, ...rest] = path;
  if (typeof table !== "string" || !tables.has(table) || typeof index !== "number") {
    return path.length === 0 ? "model" : path.map(String).join(".");
  }
  if (table === "loadCases" && rest[0] === "nodalLoads" && typeof rest[1] === "number") {
    return [locate(table, index, rest[1]), ...rest.slice(2).map(String)].join(" ");
  }
  return [locate(table as Table, index), ...rest.map(String)].join(" ");
}

function duplicates(
  rows: { id: string }[],
  table: Table,
  kind: string,
  locate: Locator,
  problems: ModelProblem[],
): Map<string, number> {
  const byId = new Map<string, number>();
  rows.forEach((row, index) => {
    const first = byId.get(row.id);
    if (first !== undefined) {
      problems.push({ where: locate(table, index), message: `duplicate ${kind} id "${row.id}" (first at ${locate(table, first)})` });
    } else {
      byId.set(row.id, index);
    }
  });
  return byId;
}

/** A problem with a link between rows (a missing material, node, section or load case), naming the linking field. */
type LinkProblem = ModelProblem & { field: string };

function checkLinks(model: TrussModel, locate: Locator): LinkProblem[] {
  const links: LinkProblem[] = [];
  checkReferences(model, locate, links);
  return links;
}

/**
 * Every check that needs the rows' values. Problems with links between rows also go to `links` when it is given
 * (with the field holding the link); then only those are collected.
 */
function checkReferences(model: TrussModel, locate: Locator, links?: LinkProblem[]): ModelProblem[] {
  const problems: ModelProblem[] = [];
  const add = (where: string, message: string) => {
    if (!links) problems.push({ where, message });
  };
  const link = (where: string, field: string, message: string) => {
    if (links) links.push({ where, field, message });
    else problems.push({ where, message });
  };

  const materials = duplicates(model.materials, "materials", "material", locate, problems);
  model.materials.forEach((m, k) => {
    if (m.E <= 0) add(locate("materials", k), `modulus E must be positive (got ${m.E})`);
    if (m.fy < 0) add(locate("materials", k), `yield strength fy must not be negative (got ${m.fy})`);
    if (m.unitWeight < 0) add(locate("materials", k), `unit weight must not be negative (got ${m.unitWeight})`);
    const { youngsModulus: E, yieldStrength: fy, unitWeight } = physical;
    if (m.E > 0 && outside(m.E, E)) add(locate("materials", k), `modulus E must be from ${E.min} to ${E.max} kPa (got ${m.E})`);
    if (m.fy > 0 && outside(m.fy, fy)) add(locate("materials", k), `yield strength fy must be from ${fy.min} to ${fy.max} kPa (got ${m.fy})`);
    if (m.unitWeight > unitWeight.max) add(locate("materials", k), `unit weight must be at most ${unitWeight.max} kN/m3 (got ${m.unitWeight})`);
    if (m.fu !== undefined && m.fu < m.fy) add(locate("materials", k), `ultimate strength fu must not be below fy (got fu ${m.fu}, fy ${m.fy})`);
  });

  const sections = duplicates(model.sections, "sections", "section", locate, problems);
  model.sections.forEach((s, k) => {
    if (s.area <= 0) add(locate("sections", k), `area must be positive (got ${s.area})`);
    if (s.radiusOfGyration < 0) add(locate("sections", k), `radius of gyration must not be negative (got ${s.radiusOfGyration})`);
    if (s.outerDiameter < 0 || s.wallThickness < 0) add(locate("sections", k), "outer diameter and wall thickness must not be negative");
    const { area, sectionLength } = physical;
    if (s.area > 0 && outside(s.area, area)) add(locate("sections", k), `area must be from ${area.min} to ${area.max} m2 (got ${s.area})`);
    if ([s.radiusOfGyration, s.outerDiameter, s.wallThickness].some((v) => v > sectionLength.max)) {
      add(locate("sections", k), `radius of gyration, outer diameter and wall thickness are at most ${sectionLength.max} m`);
    }
    if (!materials.has(s.material)) link(locate("sections", k), "material", `section "${s.id}" names a missing material "${s.material}"`);
  });

  const nodes = duplicates(model.nodes, "nodes", "node", locate, problems);
  if (model.nodes.length === 0 || model.members.length === 0) add("model", "the model needs at least one node and one member");
  model.nodes.forEach((n, k) => {
    if ([n.x, n.y, n.z].some((v) => outside(v, physical.coordinate))) {
      add(locate("nodes", k), `coordinates must be within ±${physical.coordinate} m (got ${n.x}, ${n.y}, ${n.z})`);
    }
  });
  for (const [k, first] of coincidentNodes(model.nodes)) {
    add(locate("nodes", k), `node "${model.nodes[k].id}" is at the same point as node "${model.nodes[first].id}" (closer than ${physical.nodeSpacing * 1000} mm)`);
  }
  duplicates(model.members, "members", "member", locate, problems);
  const pairs = new Map<string, number>();
  model.members.forEach((m, k) => {
    const where = locate("members", k);
    const ni = nodes.get(m.i);
    const nj = nodes.get(m.j);
    if (ni === undefined) link(where, "i", `member "${m.id}" starts at a missing node "${m.i}"`);
    if (nj === undefined) link(where, "j", `member "${m.id}" ends at a missing node "${m.j}"`);
    if (!sections.has(m.section)) link(where, "section", `member "${m.id}" names a missing section "${m.section}"`);
    if (m.effectiveLengthFactor !== undefined && m.effectiveLengthFactor <= 0) {
      add(where, `member "${m.id}" effective length factor must be positive (got ${m.effectiveLengthFactor})`);
    } else if (m.effectiveLengthFactor !== undefined && outside(m.effectiveLengthFactor, physical.effectiveLengthFactor)) {
      add(where, `member "${m.id}" effective length factor must be from ${physical.effectiveLengthFactor.min} to ${physical.effectiveLengthFactor.max}`);
    }
    if (ni === undefined || nj === undefined) return;
    if (m.i === m.j) {
      add(where, `member "${m.id}" joins node "${m.i}" to itself (zero length)`);
      return;
    }
    const a = model.nodes[ni];
    const b = model.nodes[nj];
    const length = Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
    if (length <= 1e-9) add(where, `member "${m.id}" has zero length (nodes "${m.i}" and "${m.j}" coincide)`);
    if (length > physical.memberLength) add(where, `member "${m.id}" is ${Math.round(length)} m long: members are at most ${physical.memberLength} m`);
    const key = m.i < m.j ? `${m.i}\u0000${m.j}` : `${m.j}\u0000${m.i}`;
    const first = pairs.get(key);
    if (first !== undefined) {
      add(where, `member "${m.id}" duplicates member "${model.members[first].id}" between nodes "${m.i}" and "${m.j}"`);
    } else {
      pairs.set(key, k);
    }
  });

  const supported = new Map<string, number>();
  model.supports.forEach((s, k) => {
    if (!nodes.has(s.node)) link(locate("supports", k), "node", `support on a missing node "${s.node}"`);
    const first = supported.get(s.node);
    if (first !== undefined) add(locate("supports", k), `second support on node "${s.node}" (first at ${locate("supports", first)})`);
    else supported.set(s.node, k);
  });

  const cases = duplicates(model.loadCases, "loadCases", "load case", locate, problems);
  model.loadCases.forEach((c, k) => {
    c.nodalLoads.forEach((load, l) => {
      if (!nodes.has(load.node)) link(locate("loadCases", k, l), "node", `load case "${c.id}" has a load on a missing node "${load.node}"`);
      if ([load.fx, load.fy, load.fz].some((v) => outside(v, physical.nodalLoad))) {
        add(locate("loadCases", k, l), `nodal loads must be within ±${physical.nodalLoad} kN`);
      }
    });
  });

  duplicates(model.combinations, "combinations", "combination", locate, problems);
  model.combinations.forEach((c, k) => {
    if (cases.has(c.id)) add(locate("combinations", k), `combination id "${c.id}" is also a load case id`);
    for (const [caseId, factor] of Object.entries(c.factors)) {
      if (!cases.has(caseId)) link(locate("combinations", k), `factors ${caseId}`, `combination "${c.id}" names a missing load case "${caseId}"`);
      if (outside(factor, physical.combinationFactor)) add(locate("combinations", k), `factors must be within ±${physical.combinationFactor} (got ${factor} on "${caseId}")`);
    }
  });
  return problems;
}

/**
 * Pairs [later, earlier] of node indexes closer than physical.nodeSpacing, found through a hash of grid cells of
 * that size (each node looks at its 27 neighbouring cells), so it stays linear however the nodes are laid out.
 */
function coincidentNodes(nodes: TrussNode[]): [number, number][] {
  const size = physical.nodeSpacing;
  const cells = new Map<string, number[]>();
  const found: [number, number][] = [];
  nodes.forEach((n, k) => {
    const [cx, cy, cz] = [n.x, n.y, n.z].map((v) => Math.floor(v / size));
    let match: number | undefined;
    for (let dx = -1; dx <= 1 && match === undefined; dx++) {
      for (let dy = -1; dy <= 1 && match === undefined; dy++) {
        for (let dz = -1; dz <= 1 && match === undefined; dz++) {
          match = cells.get(`${cx + dx},${cy + dy},${cz + dz}`)?.find((o) => Math.hypot(nodes[o].x - n.x, nodes[o].y - n.y, nodes[o].z - n.z) < size);
        }
      }
    }
    if (match !== undefined) found.push([k, match]);
    const key = `${cx},${cy},${cz}`;
    const cell = cells.get(key);
    if (cell) cell.push(k);
    else cells.set(key, [k]);
  });
  return found;
}
