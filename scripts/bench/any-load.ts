/**
 * "Idle for any roof load" benchmark: `npm run bench:any-load [-- --sizes 20,40,60]`.
 * Square double-layer grids from the generator (3 m module, 2 m deep), as the whole-roof job runs them
 * (server/jobs/any-load.ts): the analysis, the review context (one factorisation) and the certificate (one solve
 * per unit load at each top-layer node, x, y and z). Wall-clock and CPU seconds (user + system: the work done,
 * which on the shared machine says more than the wall clock) of one run each, with the one-minute load average
 * before and after. Target on 60 x 60: the certificate in < 60 s.
 */
import { loadavg } from "node:os";
import { parseArgs } from "node:util";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { createReviewContext, idleForAnyLoad } from "@/lib/review";

const { values } = parseArgs({ options: { sizes: { type: "string", default: "20,40,60" } } });
const seconds = <T>(run: () => T): [number, number, T] => {
  const start = performance.now();
  const cpu = process.cpuUsage();
  const value = run();
  const used = process.cpuUsage(cpu);
  return [(performance.now() - start) / 1000, (used.user + used.system) / 1e6, value];
};

const rows = [];
for (const n of values.sizes.split(",").map(Number)) {
  const before = loadavg()[0];
  const model = generateRoof({ spanX: 3 * n, spanY: 3 * n, module: 3, depth: 2 });
  const [analysis, , result] = seconds(() => analyzeModel(model));
  const [context, , reviewContext] = seconds(() => createReviewContext(model, result, { standard: "EN1993-1-1" }));
  const [certificate, certificateCpu, answer] = seconds(() => idleForAnyLoad(reviewContext));
  rows.push({
    grid: `${n} x ${n}`,
    members: model.members.length,
    "unit loads": answer.loadable.nodes * answer.loadable.directions.length,
    "analysis s": analysis.toFixed(2),
    "context s": context.toFixed(2),
    "any-load s": certificate.toFixed(2),
    "any-load CPU s": certificateCpu.toFixed(2),
    "idle for any load": answer.idleForAnyLoad.length,
    "load avg before / after": `${before.toFixed(1)} / ${loadavg()[0].toFixed(1)}`,
  });
}
console.table(rows);
