// What the viewer reads from a model, its analysis and its review. Kept narrow on purpose: the full types live in
// lib/analysis and lib/review; these aliases are the subset the drawing code depends on.

export interface ViewerNode { id: string; x: number; y: number; z: number }
export interface ViewerMember { id: string; i: string; j: string; section: string }
export interface ViewerSupport { node: string; ux: boolean; uy: boolean; uz: boolean }
export interface ViewerNodalLoad { node: string; fx: number; fy: number; fz: number }
export interface ViewerLoadCase { id: string; name: string; category?: string; selfWeight?: boolean; nodalLoads: ViewerNodalLoad[] }
export interface ViewerCombination { id: string; name: string; factors: Record<string, number> }

export interface ViewerModel {
  name: string;
  nodes: ViewerNode[];
  members: ViewerMember[];
  supports: ViewerSupport[];
  loadCases: ViewerLoadCase[];
  combinations: ViewerCombination[];
}

/** Member classes of lib/analysis classifyMembers; "other" is never filtered out. */
export type MemberGroup = "top_chord" | "bottom_chord" | "diagonal" | "other";
export type FilterableGroup = Exclude<MemberGroup, "other">;
import type { MemberVerdictKind } from "@/lib/vocabulary/member-verdict";

/** A member's verdict (lib/vocabulary/member-verdict.ts). */
export type MemberVerdict = MemberVerdictKind;

