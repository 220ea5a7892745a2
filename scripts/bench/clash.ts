// `npm run bench:clash`: clash detection on a 60 × 60 double-layer grid (28,800 members) against 2,000 run
// segments. A benchmark, not a test: it prints the time and the counts.
import { performance } from "node:perf_hooks";
import { detectClashes, type ClashModel } from "@/lib/clash/detect";
import { runSchema, type Run } from "@/lib/mep/schemas";

const MODULES = 60;
const MODULE = 3; // m
const DEPTH = 2.5; // m

function squareOnSquareOffset(n: number, a: number, h: number): ClashModel {
  const nodes: ClashModel["nodes"] = [];
  const members: ClashModel["members"] = [];
  for (let i = 0; i <= n; i++) for (let j = 0; j <= n; j++) nodes.push({ id: `T${i}.${j}`, x: a * i, y: a * j, z: h });
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) nodes.push({ id: `B${i}.${j}`, x: a * i + a / 2, y: a * j + a / 2, z: 0 });
  const add = (id: string, i: string, j: string, section: string) => members.push({ id, i, j, section });
  for (let i = 0; i <= n; i++)
    for (let j = 0; j <= n; j++) {
      if (i < n) add(`TX${i}.${j}`, `T${i}.${j}`, `T${i + 1}.${j}`, "chord");
      if (j < n) add(`TY${i}.${j}`, `T${i}.${j}`, `T${i}.${j + 1}`, "chord");
    }
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i < n - 1) add(`BX${i}.${j}`, `B${i}.${j}`, `B${i + 1}.${j}`, "chord");
      if (j < n - 1) add(`BY${i}.${j}`, `B${i}.${j}`, `B${i}.${j + 1}`, "chord");
      for (const [di, dj] of [[0, 0], [1, 0], [0, 1], [1, 1]]) add(`D${i}.${j}.${di}${dj}`, `T${i + di}.${j + dj}`, `B${i}.${j}`, "web");
    }
  return { nodes, members, sections: [{ id: "chord", outerDiameter: 0.1143 }, { id: "web", outerDiameter: 0.0889 }] };
}

/** 100 runs × 20 segments: zig-zag runs at several heights, alternately round and rectangular, some diagonal. */
function runs(): Run[] {
  const span = MODULES * MODULE;
  const result: Run[] = [];
  for (let r = 0; r < 100; r++) {
    const z = 0.4 + (r % 5) * 0.45; // 0.4 … 2.2 m, inside the 2.5 m depth
    const y0 = (r * span) / 100 + 0.7;
    const points = Array.from({ length: 21 }, (_, k) => ({ x: (k * span) / 20, y: y0 + (k % 2) * (r % 3 === 0 ? 2 : 0.5), z }));
    result.push(
      runSchema.parse({
        id: `R${r}`,
        system: ["supply air", "extract air", "chilled water", "sprinkler", "cable tray"][r % 5],
        profile: r % 2 === 0 ? { shape: "round", diameter: 0.3 + (r % 4) * 0.1 } : { shape: "rectangular", width: 0.6, height: 0.3, rotation: (r % 7) * 10 },
        insulation: 0.025,
        clearance: 0.05,
        weightPerMetre: 0.3,
        points,
      }),
    );
  }
  return result;
}

const model = squareOnSquareOffset(MODULES, MODULE, DEPTH);
const runList = runs();
const segments = runList.reduce((n, r) => n + r.points.length - 1, 0);
const coldStart = performance.now();
detectClashes(model, runList); // first call includes JIT compilation
const cold = performance.now() - coldStart;
const start = performance.now();
const clashes = detectClashes(model, runList);
const elapsed = performance.now() - start;
const hard = clashes.filter((c) => c.kind === "hard").length;
console.log(`members ${model.members.length}, run segments ${segments}`);
console.log(`clashes ${clashes.length} (hard ${hard}, clearance ${clashes.length - hard})`);
console.log(`detection ${elapsed.toFixed(1)} ms warm, ${cold.toFixed(1)} ms first call (target < 1000 ms)`);
