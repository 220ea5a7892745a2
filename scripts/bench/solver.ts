/**
 * Solver benchmark: `npm run bench:solver [-- --sizes 10,20,40,60,120 --repeat 3]`.
 * Square double-layer grids (N bays: (N+1)^2 top nodes, N^2 bottom nodes at the bay centres, 3 m module,
 * 2 m deep) with the generator's 4 load cases and 4 combinations, analysed as numbered and again with the
 * nodes and members shuffled and renamed: the fill-reducing ordering must make the cost independent of the
 * numbering. Each step is timed in CPU seconds (best of --repeat runs), because on a shared machine wall time
 * mostly measures the other processes; the wall-clock total of the same steps is shown beside it. Each grid
 * runs in its own child process, so its peak resident set is its own.
 *
 * Grids wider than the generator's span limit (100 bays of 3 m) are generated at half the module and
 * stretched to 3 m in plan, with the nodal loads scaled by the 4 x larger tributary areas: the same roof,
 * by a path only this benchmark uses.
 *
 * When libsuitesparse-dev is installed, CHOLMOD factors the same K_ff (cholmod.ts) and its figures are
 * printed beside ours.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { parseArgs } from "node:util";
import { analyzeModel, generateRoof, loadVectorForCase, PIVOT_TOLERANCE, validateModel, type TrussModel } from "@/lib/analysis";
import { assembleStiffness } from "@/lib/analysis/assemble";
import { SOLVE_BLOCK } from "@/lib/analysis/prepare";
import { freeDofsPerNode } from "@/lib/analysis/symbolic";
import { seededRandom } from "../../tests/support/fixtures/analysis-models";
import { symbolicLdl } from "@/lib/analysis/sparse/ldl";
import { fillReducingOrder } from "@/lib/analysis/sparse/ordering";
import { solveSupernodalMany } from "@/lib/analysis/sparse/solve-many";
import { factorSupernodal, supernodes } from "@/lib/analysis/sparse/supernodal";
import { buildTopology } from "@/lib/analysis/topology";
import { createReviewContext, idleForAnyLoad } from "@/lib/review";
import { buildCholmodTimer, type CholmodFigures } from "./cholmod";

const { values } = parseArgs({
  options: {
    sizes: { type: "string", default: "10,20,40,60,120" },
    repeat: { type: "string", default: "3" },
    grid: { type: "string" }, // internal: measure one grid in this (child) process and print its rows as JSON
    peak: { type: "string" }, // internal: validate and analyse this model file in a fresh process, print peak RSS
    certificate: { type: "string", default: "60" }, // grids whose whole certificate is measured
  },
});
const sizes = values.sizes.split(",").map(Number);
const repeat = Math.max(1, Number(values.repeat));
const SPAN_LIMIT = 300;

/** The N x N bay roof on a 3 m module, past the generator's span limit by the stretched half-module path. */
function squareGrid(n: number): TrussModel {
  const name = `${n} x ${n} grid`;
  if (3 * n <= SPAN_LIMIT) return generateRoof({ name, spanX: 3 * n, spanY: 3 * n, module: 3, depth: 2 });
  const half = generateRoof({ name, spanX: 1.5 * n, spanY: 1.5 * n, module: 1.5, depth: 2 });
  return {
    ...half,
    nodes: half.nodes.map((node) => ({ ...node, x: 2 * node.x, y: 2 * node.y })),
    loadCases: half.loadCases.map((c) => ({ ...c, nodalLoads: c.nodalLoads.map((l) => ({ ...l, fx: 4 * l.fx, fy: 4 * l.fy, fz: 4 * l.fz })) })),
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

type Certificate = { grid: string; members: number; loadableNodes: number; idle: number; seconds: number; wallSeconds: number };

/**
 * The "idle for any roof load" certificate, whole: the force in every member under a unit load at every free
 * top-layer dof, one solve per dof (fewer than members), by the same code the whole-roof job runs
 * (lib/review/any-load.ts over PreparedStructure.unitLoadForces, SOLVE_BLOCK loads per pass). CPU seconds of the
 * certificate after the review context (analysis and factorisation) is built, and its wall clock.
 */
function certificate(label: string, model: TrussModel): Certificate {
  const result = analyzeModel(model);
  const context = createReviewContext(model, result, { standard: "EN1993-1-1" });
  const mark = process.cpuUsage();
  const wall0 = performance.now();
  const answer = idleForAnyLoad(context);
  const seconds = cpuSince(mark);
  const wallSeconds = (performance.now() - wall0) / 1000;
  return { grid: label, members: model.members.length, loadableNodes: answer.loadable.nodes, idle: answer.idleForAnyLoad.length, seconds, wallSeconds };
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
  cpuTotal: number;
  wallTotal: number;
  analyze: number;
  peakMb: number;
  cholmod?: CholmodFigures;
};

/** CPU seconds (user + system) since `from`; on a shared machine this, not wall time, is the work done. */
const cpuSince = (from: NodeJS.CpuUsage) => {
  const used = process.cpuUsage(from);
  return (used.user + used.system) / 1e6;
};

/** Runs the solver's steps one by one (what prepareStructure and analyzeModel do), timing each in CPU seconds. */
function measure(label: string, model: TrussModel, cholmod?: ReturnType<typeof buildCholmodTimer>): Row {
  const text = JSON.stringify(model);
  let best: Row | undefined;
  for (let run = 0; run < repeat; run++) {
    let mark = process.cpuUsage();
    const lap = () => {
      const seconds = cpuSince(mark);
      mark = process.cpuUsage();
      return seconds;
    };
    const checked = validateModel(JSON.parse(text));
    const parse = lap();
    if (!checked.ok) throw new Error(`${label}: ${checked.problems[0].where}: ${checked.problems[0].message}`);
    const wall0 = performance.now();
    const topology = buildTopology(checked.model);
    const assembly1 = lap();
    const order = fillReducingOrder(topology.nodeIds.length, topology.adjStart, topology.adj, topology.coords, freeDofsPerNode(topology)).order;
    const ordering = lap();
    const assembled = assembleStiffness(topology, order);
    const assembly2 = lap();
    const structure = supernodes(assembled.matrix, symbolicLdl(assembled.matrix));
    const factor = factorSupernodal(assembled.matrix, structure, assembled.pivotScale, PIVOT_TOLERANCE);
    const factorisation = lap();
    if (factor.tinyPivots.length > 0) throw new Error(`${label}: unstable`);
    const count = checked.model.loadCases.length;
    const rhs = new Float64Array(assembled.matrix.n * count);
    checked.model.loadCases.forEach((c, k) => {
      const f = loadVectorForCase(checked.model, c.id, topology);
      for (let q = 0; q < assembled.matrix.n; q++) rhs[q * count + k] = f[assembled.dofOfEquation[q]];
    });
    solveSupernodalMany(factor, rhs, count);
    const solves = lap();
    const wallTotal = (performance.now() - wall0) / 1000;
    const result = analyzeModel(checked.model);
    const analyze = lap();
    if (result.status !== "ok") throw new Error(`${label}: analysis not ok`);
    const row: Row = {
      grid: label,
      dofs: 3 * topology.nodeIds.length,
      equations: assembled.matrix.n,
      nnzK: assembled.matrix.colPtr[assembled.matrix.n],
      nnzL: factor.nnzL,
      parse,
      assembly: assembly1 + assembly2,
      ordering,
      factor: factorisation,
      solves,
      cpuTotal: assembly1 + assembly2 + ordering + factorisation + solves,
      wallTotal,
      analyze,
      peakMb: process.resourceUsage().maxRSS / 1024,
    };
    if (!best || row.cpuTotal < best.cpuTotal) best = row;
  }
  if (cholmod) {
    const topology = buildTopology(model);
    const order = fillReducingOrder(topology.nodeIds.length, topology.adjStart, topology.adj, topology.coords, freeDofsPerNode(topology)).order;
    best!.cholmod = cholmod(assembleStiffness(topology, order).matrix, model.loadCases.length, repeat);
  }
  return best!;
}

/**
 * Peak resident set of a fresh process that reads the model file, validates it and runs analyzeModel (the
 * whole analysis process, results included), in MB, with the CPU seconds of the analysis.
 */
function wholeProcessPeak(model: TrussModel): { peakMb: number; analyzeSeconds: number } {
  const dir = mkdtempSync(join(tmpdir(), "bench-solver-"));
  const file = join(dir, "model.json");
  try {
    writeFileSync(file, JSON.stringify(model));
    const child = spawnSync(process.execPath, [...process.execArgv, process.argv[1], "--peak", file], { encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] });
    if (child.status !== 0) throw new Error("peak measurement: child process failed");
    return JSON.parse(child.stdout) as { peakMb: number; analyzeSeconds: number };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (values.peak) {
  const mark = process.cpuUsage();
  const checked = validateModel(JSON.parse(readFileSync(values.peak, "utf8")));
  if (!checked.ok) throw new Error(`${values.peak}: not a valid model`);
  if (analyzeModel(checked.model).status !== "ok") throw new Error(`${values.peak}: analysis not ok`);
  process.stdout.write(`${JSON.stringify({ peakMb: process.resourceUsage().maxRSS / 1024, analyzeSeconds: cpuSince(mark) })}\n`);
} else if (values.grid) {
  const n = Number(values.grid);
  const cholmod = buildCholmodTimer();
  measure("warm-up", generateRoof({ spanX: 30, spanY: 30, module: 3, depth: 2 }));
  const model = squareGrid(n);
  const rows = [measure(`${n}x${n}`, model, cholmod), measure(`${n}x${n} shuffled`, shuffle(model, n), cholmod)];
  const work = values.certificate.split(",").map(Number).includes(n) ? certificate(`${n}x${n}`, model) : undefined;
  // The peak depends on when V8 collects, so the process is run --repeat times and the highest and lowest kept.
  const runs = Array.from({ length: repeat }, () => wholeProcessPeak(model));
  const peak = { grid: `${n}x${n}`, runs: repeat, peakMb: Math.max(...runs.map((r) => r.peakMb)), lowestPeakMb: Math.min(...runs.map((r) => r.peakMb)), analyzeSeconds: Math.min(...runs.map((r) => r.analyzeSeconds)) };
  process.stdout.write(`${JSON.stringify({ rows, certificate: work, peak })}\n`);
} else {
  const loadAtStart = loadavg()[0];
  const rows: Row[] = [];
  const certificates: Certificate[] = [];
  const peaks: { grid: string; runs: number; peakMb: number; lowestPeakMb: number; analyzeSeconds: number }[] = [];
  for (const n of sizes) {
    const child = spawnSync(process.execPath, [...process.execArgv, process.argv[1], "--grid", String(n), "--repeat", String(repeat), "--certificate", values.certificate], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "inherit"],
      maxBuffer: 1 << 24,
    });
    if (child.status !== 0) throw new Error(`grid ${n}: child process failed`);
    const measured = JSON.parse(child.stdout) as { rows: Row[]; certificate?: Certificate; peak: (typeof peaks)[number] };
    rows.push(...measured.rows);
    peaks.push(measured.peak);
    if (measured.certificate) certificates.push(measured.certificate);
  }
  const s = (v: number) => v.toFixed(3);
  const withCholmod = rows.some((r) => r.cholmod);
  const lines = [
    "| grid | DOFs | equations | nnz K (upper) | nnz L | fill L/K | parse | assembly | ordering | factorisation | 4 solves | assembly+ordering+factor+solves | same, wall clock | full analyzeModel | peak RSS MB |",
    "| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |",
    ...rows.map(
      (r) =>
        `| ${r.grid} | ${r.dofs} | ${r.equations} | ${r.nnzK} | ${r.nnzL} | ${(r.nnzL / r.nnzK).toFixed(2)} | ${s(r.parse)} | ${s(r.assembly)} | ${s(r.ordering)} | ${s(r.factor)} | ${s(r.solves)} | ${s(r.cpuTotal)} | ${s(r.wallTotal)} | ${s(r.analyze)} | ${r.peakMb.toFixed(0)} |`,
    ),
  ];
  if (withCholmod) {
    lines.push(
      "",
      `Beside CHOLMOD on the same K_ff (best of its AMD, METIS and NESDIS orderings, timed with that ordering only, best of ${repeat} runs like ours; CPU seconds; ours: ordering + factorisation + solves, without assembly):`,
      "",
      "| grid | CHOLMOD ordering | CHOLMOD nnz L | ours nnz L | fill ratio ours / CHOLMOD | CHOLMOD analyse + factor + 4 solves | ours | time ratio ours / CHOLMOD |",
      "| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: |",
      ...rows
        .filter((r) => r.cholmod)
        .map((r) => {
          const c = r.cholmod!;
          const theirs = c.analyze + c.factor + c.solve;
          const ours = r.ordering + r.factor + r.solves;
          return `| ${r.grid} | ${c.ordering} | ${c.nnzL} | ${r.nnzL} | ${(r.nnzL / c.nnzL).toFixed(2)} | ${s(theirs)} | ${s(ours)} | ${(ours / theirs).toFixed(2)} |`;
        }),
    );
  }
  if (certificates.length > 0) {
    lines.push(
      "",
      `"Idle for any roof load" certificate, whole (unit load at every free top-layer dof, ${SOLVE_BLOCK} per pass over the factor, the forces of every member under each; lib/review/any-load.ts as the job runs it):`,
      "",
      "| grid | members | loadable nodes | idle for any load | CPU seconds | wall seconds |",
      "| --- | ---: | ---: | ---: | ---: | ---: |",
      ...certificates.map((c) => `| ${c.grid} | ${c.members} | ${c.loadableNodes} | ${c.idle} | ${s(c.seconds)} | ${s(c.wallSeconds)} |`),
    );
  }
  lines.push(
    "",
    "Whole analysis process (a fresh Node.js process reads the model JSON, validates it and runs analyzeModel, results included):",
    "",
    "| grid | runs | peak RSS MB, highest | lowest | CPU seconds, best |",
    "| --- | ---: | ---: | ---: | ---: |",
    ...peaks.map((p) => `| ${p.grid} | ${p.runs} | ${p.peakMb.toFixed(0)} | ${p.lowestPeakMb.toFixed(0)} | ${s(p.analyzeSeconds)} |`),
  );
  const load = `load average (1 min) ${loadAtStart.toFixed(1)} at the start, ${loadavg()[0].toFixed(1)} at the end`;
  process.stdout.write(`Seconds of CPU time (user + system), best of ${repeat} runs, except the wall-clock column; ${load}.\n${lines.join("\n")}\n`);
}
