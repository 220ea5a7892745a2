import type { Discipline, PinState } from "@/lib/realtime/events";

/** Topic statuses we write (declared in extensions.xml) for our thread states. */
export const TOPIC_STATUSES: Record<PinState, string> = { open: "Open", answered: "Answered", closed: "Closed" };

/** Reads any tool's topic status as a thread state; unknown statuses count as open (nothing is hidden). */
export function pinStateOf(status: string): PinState {
  const s = status.trim().toLowerCase().replace(/[\s_-]+/g, " ");
  if (["closed", "done", "rejected"].includes(s)) return "closed";
  if (["answered", "resolved", "solved"].includes(s)) return "answered";
  return "open";
}

/** Topic types we write: the pin's discipline, in words. */
export const TOPIC_TYPES: Record<Discipline, string> = { structural: "Structural", architectural: "Architectural", mep: "MEP", general: "General" };

/** A topic type as a discipline; other tools' types (Error, Clash, ...) become general. */
export function disciplineOf(type: string): Discipline {
  const found = (Object.entries(TOPIC_TYPES) as [Discipline, string][]).find(([, label]) => label.toLowerCase() === type.trim().toLowerCase());
  return found?.[0] ?? "general";
}
