"use client";
// Runs read from an IFC file but not stored yet: the import form puts them here and the MEP layer draws them in the
// viewer, so the user sees where they lie before confirming.
import { create } from "zustand";
import type { Run } from "@/lib/mep/schemas";

interface RunPreview {
  runs: Run[];
  show(runs: Run[]): void;
  clear(): void;
}

export const useRunPreviewStore = create<RunPreview>()((set) => ({
  runs: [],
  show: (runs) => set({ runs }),
  clear: () => set({ runs: [] }),
}));
