// A revision as the viewer opens it: the small JSON overview (…/models/N/summary) and the binary geometry
// (…/models/N/geometry, immutable and cached), fetched side by side and joined into the narrow model the drawing
// code reads. No result, review row or material comes with it: each result's columns, one member's detail and,
// for browser what-ifs, the whole revision (fetchFullRevision) are fetched when needed.
import type { RevisionOverview } from "@/db/queries/revision-view";
import { apiFetch, apiFetchBytes } from "@/lib/http/fetcher";
import { MEMBER_KIND_CODES, unpackGeometry, type WireGeometry } from "@/lib/models/geometry-wire";
import { revisionUrls } from "@/lib/models/viewer-urls";
import type { AnalysisResult, TrussModel } from "@/lib/analysis";
import type { MemberGroup, ViewerModel } from "./types";

/** Query key of a revision as the viewer opens it (the viewer and the live review share it). */
export const revisionQueryKey = (projectId: string, number: number) => ["projects", projectId, "models", number] as const;

/** A revision as the viewer keeps it: the overview with the model rebuilt from the geometry, and the rule book's answer. */
export type ViewedRevision = Omit<RevisionOverview, "model"> & {
  model: ViewerModel;
  groups: Record<string, MemberGroup>;
  abilities: { runAnalysis: boolean };
};

// Float32 keeps about 7 significant digits: printing a coordinate from it as 7 digits gives back the decimal that
// was stored (1.8, not 1.7999999523162842).
const decimal = (value: number) => Number(value.toPrecision(7));

/** The viewer's model from the overview's tables and the geometry's arrays and ids. */
export function modelFromGeometry(overview: RevisionOverview["model"], geometry: WireGeometry): { model: ViewerModel; groups: Record<string, MemberGroup> } {
  const { coordinates: c, ends, sections, kinds, nodeIds, memberIds, sectionIds } = geometry;
  const nodes = nodeIds.map((id, k) => ({ id, x: decimal(c[3 * k]), y: decimal(c[3 * k + 1]), z: decimal(c[3 * k + 2]) }));
  const groups: Record<string, MemberGroup> = {};
  const members = memberIds.map((id, k) => {
    groups[id] = MEMBER_KIND_CODES[kinds[k]] ?? "other";
    return { id, i: nodeIds[ends[2 * k]], j: nodeIds[ends[2 * k + 1]], section: sectionIds[sections[k]] };
  });
  return { model: { ...overview, nodes, members }, groups };
}

/** The fetch behind revisionQueryKey: overview and geometry side by side. */
export async function fetchRevision(projectId: string, number: number): Promise<ViewedRevision> {
  const urls = revisionUrls(projectId, number);
  const [body, bytes] = await Promise.all([apiFetch<{ revision: RevisionOverview; abilities: ViewedRevision["abilities"] }>(urls.summary), apiFetchBytes(urls.geometry)]);
  return { ...body.revision, ...modelFromGeometry(body.revision.model, unpackGeometry(bytes)), abilities: body.abilities };
}

/** The whole stored revision (model and design-format results): only the browser what-ifs need it. */
export async function fetchFullRevision(projectId: string, number: number): Promise<{ model: TrussModel; result: AnalysisResult }> {
  const body = await apiFetch<{ revision: { model: TrussModel; analysis: { result: AnalysisResult } | null } }>(`/api/projects/${projectId}/models/${number}`);
  if (!body.revision.analysis) throw new Error("This revision has no stored analysis to work from.");
  return { model: body.revision.model, result: body.revision.analysis.result };
}
