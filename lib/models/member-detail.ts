// One member's full detail as the member panel reads it (GET …/models/N/members/<id>): its force and zero flag in
// every result, the displacements (and any support reactions) of its two end nodes in every result, envelope,
// governing results and its review with the arithmetic, and the standing caution.
import type { EnvelopeEntry } from "@/lib/analysis/analyze";
import { STANDING_CAUTION } from "@/lib/review/caution";
import type { StoredMemberReview } from "./analyse";
import { nodeResultsFrom, type NodeResult } from "./node-detail";
import { memberResultsFrom } from "./result-columns";

export type MemberDetail = {
  member: { id: string; i: string; j: string; section: string; index: number };
  results: Record<string, { force: number; zero: boolean }>;
  /** Per result, its end nodes i and j: displacement and, where supported, reaction. */
  ends: Record<string, { i: NodeResult; j: NodeResult }>;
  envelope: EnvelopeEntry | null;
  envelopeOver: string | null;
  governing: { maxTension: string | null; maxCompression: string | null } | null;
  review: StoredMemberReview | null;
  standard: string | null;
  caution: string;
};

type Stored = {
  index: number;
  member: { id: string; i: string; j: string; section: string };
  results: { resultId: string; force: Uint8Array; zeroByte: Uint8Array }[];
  ends: Parameters<typeof nodeResultsFrom>[0];
  envelope: EnvelopeEntry | null;
  envelopeOver: string | null;
  governing: MemberDetail["governing"];
  review: StoredMemberReview | null;
  standard: string | null;
};

function endsFrom(member: { i: string; j: string }, rows: Stored["ends"]): MemberDetail["ends"] {
  return Object.fromEntries(Object.entries(nodeResultsFrom(rows)).map(([resultId, nodes]) => [resultId, { i: nodes[member.i], j: nodes[member.j] }]));
}

/** The answer for the member panel from what db/queries/result-columns.ts getMemberColumns read. */
export function presentMemberDetail(stored: Stored): MemberDetail {
  return {
    member: { id: stored.member.id, i: stored.member.i, j: stored.member.j, section: stored.member.section, index: stored.index },
    results: memberResultsFrom(stored.index, stored.results),
    ends: endsFrom(stored.member, stored.ends),
    envelope: stored.envelope,
    envelopeOver: stored.envelopeOver,
    governing: stored.governing,
    review: stored.review,
    standard: stored.standard,
    caution: STANDING_CAUTION,
  };
}
