"use client";
// Who is in the review now, with their role, and whether they present, follow or have stepped out.
import { RoleBadge } from "@/components/project/role-badge";
import { useSessionStore } from "./session-store";

export function PresenceList() {
  const presence = useSessionStore((s) => s.presence);
  const hasSession = useSessionStore((s) => s.session !== null);
  return (
    <section aria-label="Who is here">
      <h3 className="text-xs font-semibold uppercase tracking-wide text-board-700">Here now ({presence.length})</h3>
      <ul className="mt-1 flex flex-col gap-1" data-testid="presence-list">
        {presence.map((entry) => (
          <li key={entry.id} className="flex items-center justify-between gap-2 text-sm" data-testid="presence-entry" data-user-id={entry.id}>
            <span className="truncate">{entry.name}</span>
            <span className="flex items-center gap-1">
              <RoleBadge role={entry.role} />
              {hasSession ? (
                <span className="text-xs text-board-700">{entry.presenting ? "presenting" : entry.following ? "following" : "looking around"}</span>
              ) : null}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
