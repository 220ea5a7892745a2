/**
 * Solver benchmark: `npm run bench:solver [-- --sizes 10,20,40,60 --repeat 3]`.
 * Square double-layer grids (N bays: (N+1)^2 top nodes, N^2 bottom nodes at the bay centres, 3 m module,
 * 2 m deep) with the generator's 4 load cases and 4 combinations, analysed as numbered and again with the
 * nodes and members shuffled and renamed: the fill-reducing ordering must make the cost independent of the
 * numbering. Times are wall-clock seconds, best of --repeat runs (the machine is shared, so the CPU seconds
 * of the same steps are shown too); peak memory is the process's peak resident set so far.
 */
import { parseArgs } from "node:util";
import { analyzeModel, generateRoof, loadVectorForCase, prepareStructure, validateModel, type TrussModel } from "@/lib/analysis";

const { values } = parseArgs({
  options: { sizes: { type: "string", default: "10,20,40,60" }, repeat: { type: "string", default: "3" } },
});
const sizes = values.sizes.split(",").map(Number);
const repeat = Math.max(1, Number(values.repeat));

function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function shuffled<T>(items: T[], random: () => number): T[] {
  const out = items.slice();
  for (let k = out.length - 1; k > 0; k--) {
    const r = Math.floor(random() * (k + 1));
    [out[k], out[r]] = [out[r], out[k]];
  }
  return out;
}

/** Same structure, nodes and members in random order under random new ids. */
function shuffle(model: TrussModel, seed: number): TrussModel {
  const random = seededRandom(seed);
  const nodes = shuffled(model.nodes, random);
  const rename = new Map(nodes.map((n, k) => [n.id, `N${(k * 7919) % nodes.length}`]));
  const id = (old: string) => rename.get(old)!;
  return {
    ...model,
    nodes: nodes.map((n) => ({ ...n, id: id(n.id) })),
    members: shuffled(model.members, random).map((m, k) => ({ ...m, id: `M${k}`, i: id(m.i), j: id(m.j) })),
    supports: model.supports.map((s) => ({ ...s, node: id(s.node) })),
    loadCases: model.loadCases.map((c) => ({ ...c, nodalLoads: c.nodalLoads.map((l) => ({ ...l, node: id(l.node) })) })),
  };
}

type Row = {
  grid: string;
  dofs: number;
  equations: number;
  nnzK: number;
  nnzL: number;
  parse: number;
  assembly: number;
  ordering: number;
  factor: number;
  solves: number;
  analyze: number;
  cpu: number;
  peakMb: number;
};

function measure(label: string, model: TrussModel): Row {
  const text = JSON.stringify(model);
  let best: Row | undefined;
  for (let run = 0; run < repeat; run++) {
    const t0 = performance.now();
    const checked = validateModel(JSON.parse(text));
    const t1 = performance.now();
    if (!checked.ok) throw new Error(`${label}: ${checked.problems[0].where}: ${checked.problems[0].message}`);
    const c0 = process.cpuUsage();
    const structure = prepareStructure(checked.model);
    if (structure.status !== "ok") throw new Error(`${label}: unstable at ${JSON.stringify(structure.instability.slice(0, 3))}`);
    const t2 = performance.now();
    structure.solveMany(checked.model.loadCases.map((c) => loadVectorForCase(checked.model, c.id, structure.topology)));
    const t3 = performance.now();
    const cpu = process.cpuUsage(c0);
    const result = analyzeModel(checked.model);
    const t4 = performance.now();
    if (result.status !== "ok") throw new Error(`${label}: analysis not ok`);
    const row: Row = {
      grid: label,
      dofs: structure.stats.dofs,
      equations: structure.stats.equations,
      nnzK: structure.stats.nonzerosK,
      nnzL: structure.stats.nonzerosL,
      parse: (t1 - t0) / 1000,
      assembly: structure.timings.assembly / 1000,
      ordering: structure.timings.ordering / 1000,
      factor: structure.timings.factorisation / 1000,
      solves: (t3 - t2) / 1000,
      analyze: (t4 - t3) / 1000,
      cpu: (cpu.user + cpu.system) / 1e6,
      peakMb: process.resourceUsage().maxRSS / 1024,
    };
    const total = (r: Row) => r.assembly + r.ordering + r.factor + r.solves;
    if (!best || total(row) < total(best)) best = row;
  }
  return best!;
}

const rows: Row[] = [];
measure("warm-up", generateRoof({ spanX: 30, spanY: 30, module: 3, depth: 2 }));
for (const n of sizes) {
  const model = generateRoof({ name: `${n} x ${n} grid`, spanX: 3 * n, spanY: 3 * n, module: 3, depth: 2 });
  rows.push(measure(`${n}x${n}`, model));
  rows.push(measure(`${n}x${n} shuffled`, shuffle(model, n)));
}

const s = (v: number) => v.toFixed(3);
const lines = [
  "| grid | DOFs | equations | nnz K (upper) | nnz L | fill L/K | parse s | assembly s | ordering s | factor s | 4 solves s | asm+ord+factor+solves s | same, CPU s | full analyzeModel s | peak RSS MB |",
  "| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |",
  ...rows.map(
    (r) =>
      `| ${r.grid} | ${r.dofs} | ${r.equations} | ${r.nnzK} | ${r.nnzL} | ${(r.nnzL / r.nnzK).toFixed(2)} | ${s(r.parse)} | ${s(r.assembly)} | ${s(r.ordering)} | ${s(r.factor)} | ${s(r.solves)} | ${s(r.assembly + r.ordering + r.factor + r.solves)} | ${s(r.cpu)} | ${s(r.analyze)} | ${r.peakMb.toFixed(0)} |`,
  ),
];
process.stdout.write(`${lines.join("\n")}\n`);
