// The plain data a review report is built from (lib/report/pdf.ts): read from PostgreSQL by
// db/queries/report.ts, or made by hand in tests.
import type { AnalysisResult } from "../analysis/analyze";
import type { TrussModel } from "../analysis/model";

export type ReportClash = {
  clashKey: string;
  memberId: string;
  runId: string;
  kind: string;
  status: string;
  /** The outcome in our words (glossary.md), or null when nobody has proposed one. */
  outcome: string | null;
  note: string;
  conditions: string | null;
  proposedBy: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
};

export type ReportQuestion = {
  title: string;
  /** What the pin hangs on, in words: "member B-12", "clash 3f9a…", "point (1.0, 2.0, 3.0)". */
  anchor: string;
  state: "open" | "answered";
  author: string;
  createdAt: string;
  comments: number;
};

export type ReportInput = {
  project: { name: string; description: string };
  revision: { number: number; name: string; createdAt: string; createdBy: string | null };
  model: TrussModel;
  result: AnalysisResult;
  /** Result ids (load cases or combinations) to tabulate, in the chosen order. */
  combinations: string[];
  /** Two result ids whose member states are compared, or null. */
  compare: [string, string] | null;
  clashes: ReportClash[];
  openQuestions: ReportQuestion[];
  generatedAt: string;
  generatedBy: string;
};
