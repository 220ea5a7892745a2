"use client";
// A page's live updates without a live review of its own (models, report): the project's live invalidations,
// job progress among them, refetch what they name (use-live-invalidation.ts). Draws nothing.
import { useLiveInvalidation } from "./use-live-invalidation";

export function LiveInvalidation({ projectId, realtimeUrl }: { projectId: string; realtimeUrl: string }) {
  useLiveInvalidation(projectId, realtimeUrl);
  return null;
}
