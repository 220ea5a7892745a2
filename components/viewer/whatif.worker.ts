// Web Worker: removal and opening what-ifs, why-zero explanations and influence maps from lib/review, off the main thread so the
// viewer stays responsive. The review context (one factorisation of the stiffness) is built once per revision.
import type { AnalysisResult, TrussModel } from "@/lib/analysis";
import { createReviewContext, type ReviewContext } from "@/lib/review/context";
import { influenceMap } from "@/lib/review/influence";
import { assessOpening } from "@/lib/review/opening";
import { removalWhatIf } from "@/lib/review/removal";
import { explainZeroForces, type WhyZero } from "@/lib/review/why-zero";
import type { WhatIfAnswer, WhatIfMessage, WhatIfReply, WhatIfRequest } from "./whatif-protocol";

let context: ReviewContext | null = null;
let explanations: Record<string, WhyZero[]> | null = null;

function answer(request: WhatIfRequest): WhatIfAnswer {
  if (request.kind === "init") {
    context = createReviewContext(request.model, request.result, { standard: request.standard });
    explanations = null;
    return { ready: true };
  }
  if (!context) throw new Error("the what-if worker was asked before it was given the revision");
  switch (request.kind) {
    case "removal":
      return removalWhatIf(context, { remove: [request.member], maxListed: 10 });
    case "opening": {
      const e = context.memberIndex.get(request.member);
      if (e === undefined) throw new Error(`no member "${request.member}"`);
      const input = context.inputs[e];
      if (!input.outerDiameter || !input.wallThickness) throw new Error("this member's section has no tube dimensions, so an opening cannot be checked");
      const forces = context.designResults.map((id) => ({ combination: id, force: context!.forces.get(id)![e] }));
      return assessOpening({ standard: context.options.standard, member: { ...input, outerDiameter: input.outerDiameter, wallThickness: input.wallThickness }, opening: request.opening, forces });
    }
    case "whyZero": {
      explanations ??= explainZeroForces(context.model as TrussModel, context.result as AnalysisResult);
      return explanations[request.resultId]?.find((w) => w.member === request.member) ?? null;
    }
    case "influence":
      return influenceMap(context, request.member);
  }
}

self.onmessage = (event: MessageEvent<WhatIfMessage>) => {
  const { id, request } = event.data;
  let reply: WhatIfReply;
  try {
    reply = { id, ok: true, answer: answer(request) };
  } catch (error) {
    reply = { id, ok: false, error: error instanceof Error ? error.message : String(error) };
  }
  self.postMessage(reply);
};
