// Messages between the member panel and the what-if worker (whatif.worker.ts). Every request but "init" names
// one member; "influence" answers with that member's influence map over the top-layer nodes.
import type { AnalysisResult, TrussModel } from "@/lib/analysis";
import type { DesignStandard } from "@/lib/review/design-checks/types";
import type { InfluenceMap } from "@/lib/review/influence";
import type { OpeningAssessment, OpeningSpec } from "@/lib/review/opening";
import type { RemovalOutcome } from "@/lib/review/removal";
import type { WhyZero } from "@/lib/review/why-zero";

export type WhatIfRequest =
  | { kind: "init"; model: TrussModel; result: AnalysisResult; standard: DesignStandard }
  | { kind: "removal"; member: string }
  | { kind: "opening"; member: string; opening: OpeningSpec }
  | { kind: "whyZero"; member: string; resultId: string }
  | { kind: "influence"; member: string };

export type WhatIfAnswer = { ready: true } | RemovalOutcome | OpeningAssessment | WhyZero | InfluenceMap | null;

export type WhatIfMessage = { id: number; request: WhatIfRequest };
export type WhatIfReply = { id: number; ok: true; answer: WhatIfAnswer } | { id: number; ok: false; error: string };
