"use client";
// The pins of the project with filters by state, discipline and author; a pin whose member or node is not in the
// revision shown is marked detached.
import { anchorLabel } from "@/lib/realtime/anchors";
import { DISCIPLINES, PIN_STATES, type PinFilter } from "@/lib/realtime/events";
import { DISCIPLINE_LABELS } from "./new-pin-form";
import { commentCountOf, filterPins, useSessionStore } from "./session-store";

export function PinList({ detached }: { detached: ReadonlySet<string> }) {
  const pins = useSessionStore((s) => s.pins);
  const comments = useSessionStore((s) => s.comments);
  const filter = useSessionStore((s) => s.filter);
  const selectedPinId = useSessionStore((s) => s.selectedPinId);
  const { setFilter, selectPin } = useSessionStore.getState();
  const authors = [...new Map(Object.values(pins).map((p) => [p.author.id, p.author.name])).entries()];
  const shown = filterPins(pins, filter);
  const choose = (key: keyof PinFilter, value: string) => setFilter({ [key]: value || undefined });

  return (
    <section className="flex flex-col gap-2" aria-label="Pins">
      <div className="flex flex-wrap gap-1 text-sm">
        <select aria-label="State" className="rounded border border-board-200 px-1" value={filter.state ?? ""} onChange={(e) => choose("state", e.target.value)} data-testid="pin-filter-state">
          <option value="">any state</option>
          {PIN_STATES.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </select>
        <select aria-label="Discipline" className="rounded border border-board-200 px-1" value={filter.discipline ?? ""} onChange={(e) => choose("discipline", e.target.value)}>
          <option value="">any discipline</option>
          {DISCIPLINES.map((d) => (
            <option key={d} value={d}>
              {DISCIPLINE_LABELS[d]}
            </option>
          ))}
        </select>
        <select aria-label="Author" className="rounded border border-board-200 px-1" value={filter.authorId ?? ""} onChange={(e) => choose("authorId", e.target.value)}>
          <option value="">anyone</option>
          {authors.map(([id, name]) => (
            <option key={id} value={id}>
              {name}
            </option>
          ))}
        </select>
      </div>
      {shown.length === 0 ? <p className="text-sm text-board-700">No pins {Object.values(filter).some(Boolean) ? "match these filters" : "yet"}.</p> : null}
      <ul className="flex flex-col gap-1" data-testid="pin-list">
        {shown.map((pin) => {
          const count = commentCountOf(pin, comments[pin.id]);
          return (
          <li key={pin.id}>
            <button
              type="button"
              className={`w-full rounded-md border px-2 py-1 text-left text-sm ${pin.id === selectedPinId ? "border-selection bg-selection/5" : "border-board-200 bg-white"}`}
              onClick={() => selectPin(pin.id)}
              data-testid="pin-item"
              data-pin-id={pin.id}
            >
              <span className="block font-medium">{pin.title}</span>
              <span className="block text-xs text-board-700">
                {pin.state} · {anchorLabel(pin.anchor)}
                {detached.has(pin.id) ? " · detached (not in this revision)" : ""} · {pin.author.name} · {count} comment{count === 1 ? "" : "s"}
              </span>
            </button>
          </li>
          );
        })}
      </ul>
    </section>
  );
}
