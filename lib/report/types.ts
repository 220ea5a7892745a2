// The plain data a review report is built from (lib/report/pdf.ts): read from PostgreSQL and object storage by the
// report job (server/jobs/report-data.ts), or made by hand in tests.
import type { AnalysisResult } from "../analysis/analyze";
import type { TrussModel } from "../analysis/model";
import type { StoredReview } from "../models/analyse";

/** One step of a clash's history (clash_decisions), oldest first. */
export type ReportClashStep = {
  /** The step in our words: Proposed, Decided, Decision superseded, Needs another look, Closed. */
  step: string;
  outcome: string | null;
  by: string | null;
  role: string | null;
  /** The revision the step was taken on (a carried decision names an earlier one). */
  revision: number | null;
  at: string;
  /** Note, conditions or reason, in one line. */
  text: string;
};

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
  /** Where the run meets the member (m), for the plan snippet. */
  point: { x: number; y: number; z: number };
  history: ReportClashStep[];
};

/** One step of a pin thread's record (proposal, decision, supersession), oldest first. */
export type ReportThreadStep = {
  /** The step in our words: Proposed, Decided, Decision superseded. */
  step: string;
  by: string;
  /** The author's role when the step was taken, in our words. */
  role: string | null;
  at: string;
  /** The revision and the stored analysis it was judged on (null when no revision was current then). */
  judgedOn: { revision: number | null; analysedAt: string | null };
  /** What is proposed or decided, or for a supersession "Reason: …". */
  text: string;
  conditions: string | null;
  /** For a supersession: the decision it supersedes, as who decided it and when. */
  supersedes: { by: string; at: string } | null;
  /** The caution shown with the step when it was taken. */
  caution: string | null;
};

/** A pin's thread that has proposals or decisions in its record. */
export type ReportThread = {
  title: string;
  anchor: string;
  state: string;
  steps: ReportThreadStep[];
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

/** What identifies the reported revision beyond its number: who made it current, and the stored bytes' hash. */
export type ReportIdentity = {
  isCurrent: boolean;
  /** Who marked the revision current, and when; null when nobody has (yet). */
  madeCurrent: { by: string | null; at: string } | null;
  /** SHA-256 of each stored model file (the uploaded bytes), or of the stored model JSON for a generated revision. */
  hashes: { of: string; sha256: string }[];
};

export type ReportInput = {
  project: { name: string; description: string };
  revision: { number: number; name: string; createdAt: string; createdBy: string | null };
  identity: ReportIdentity;
  model: TrussModel;
  result: AnalysisResult;
  /** The member review (design checks with arithmetic), or null when none is stored. */
  review: StoredReview | null;
  /** Result ids (load cases or combinations) to tabulate and draw, in the chosen order. */
  combinations: string[];
  /** Two result ids whose member states are compared, or null. */
  compare: [string, string] | null;
  clashes: ReportClash[];
  threads: ReportThread[];
  openQuestions: ReportQuestion[];
  generatedAt: string;
  generatedBy: string;
};
