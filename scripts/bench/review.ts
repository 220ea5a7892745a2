/**
 * Review engine benchmark: `npm run bench:review [-- --sizes 20,40,60 --repeat 3]`.
 * Square double-layer grids from the generator (3 m module, 2 m deep). After the first analysis and one
 * factorisation (the review context), times: removal what-if of one member and of three members (low-rank
 * update of the intact factor, all load cases and combinations, design re-check of every member), the same
 * removal re-analysed from scratch for comparison, an influence map (one adjoint solve) and the whole-model
 * review. Wall-clock seconds, best of --repeat runs (the machine is shared). Targets on 60 x 60: removal < 1 s,
 * influence map < 0.3 s.
 */
import { parseArgs } from "node:util";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { createReviewContext, influenceMap, removalWhatIf, reviewModel } from "@/lib/review";

const { values } = parseArgs({ options: { sizes: { type: "string", default: "20,40,60" }, repeat: { type: "string", default: "3" } } });
const sizes = values.sizes.split(",").map(Number);
const repeat = Math.max(1, Number(values.repeat));

function best<T>(run: () => T): { seconds: number; value: T } {
  let seconds = Infinity;
  let value!: T;
  for (let k = 0; k < repeat; k++) {
    const start = performance.now();
    value = run();
    seconds = Math.min(seconds, (performance.now() - start) / 1000);
  }
  return { seconds, value };
}

const rows = [];
for (const n of sizes) {
  const model = generateRoof({ spanX: 3 * n, spanY: 3 * n, module: 3, depth: 2 });
  const first = best(() => analyzeModel(model));
  const context = best(() => createReviewContext(model, first.value, { standard: "EN1993-1-1" }));
  const mid = Math.floor(n / 2);
  const one = [`D-${mid}-${mid}-NE`];
  const three = [`D-${mid}-${mid}-NE`, `BCX-${mid}-${mid - 1}`, `TCY-${mid - 2}-${mid}`];
  const removeOne = best(() => removalWhatIf(context.value, { remove: one }));
  const removeThree = best(() => removalWhatIf(context.value, { remove: three }));
  if (removeOne.value.mechanism || removeThree.value.mechanism) throw new Error("unexpected mechanism");
  const scratch = best(() => analyzeModel({ ...model, members: model.members.filter((m) => !one.includes(m.id)) }));
  const influence = best(() => influenceMap(context.value, `TCX-${mid}-${mid}`));
  const review = best(() => reviewModel(model, first.value, { standard: "EN1993-1-1" }, context.value));
  rows.push({
    grid: `${n} x ${n}`,
    members: model.members.length,
    dofs: 3 * model.nodes.length,
    "analysis s": first.seconds.toFixed(3),
    "context s": context.seconds.toFixed(3),
    "remove 1 s": removeOne.seconds.toFixed(3),
    "remove 3 s": removeThree.seconds.toFixed(3),
    "re-analyse s": scratch.seconds.toFixed(3),
    "influence s": influence.seconds.toFixed(3),
    "review s": review.seconds.toFixed(3),
    "changed (ULS-2)": removeOne.value.changes.find((c) => c.result === "ULS-2")?.changedCount ?? 0,
  });
}
console.table(rows);
