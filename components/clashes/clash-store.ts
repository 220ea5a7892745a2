"use client";
// Which clash is selected, shared by the clash table, the decision panel, the viewer's clash markers and the pin
// form. The id is the stable clash id (clashes.clash_key) — the one pins anchor to — not the row id.
import { create } from "zustand";

interface ClashSelection {
  selectedClashId: string | null;
  selectClash(id: string | null): void;
}

export const useClashStore = create<ClashSelection>()((set) => ({
  selectedClashId: null,
  selectClash: (id) => set({ selectedClashId: id }),
}));
