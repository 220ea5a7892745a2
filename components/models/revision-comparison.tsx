// The comparison of two revisions as tables (lib/models/compare-revisions.ts): members, force states per result,
// verdicts and clashes. Long lists are folded so a large roof stays readable.
import Link from "next/link";
import type { RevisionComparison } from "@/lib/models/compare-revisions";

const MAX_LISTED = 200;

function Section({ title, count, testId, children }: { title: string; count: number; testId: string; children: React.ReactNode }) {
  return (
    <details className="rounded-xl border border-board-200 bg-white p-4" open={count > 0 && count <= 50} data-testid={testId} data-count={count}>
      <summary className="cursor-pointer font-semibold text-board-900">
        {title}: {count === 0 ? "none" : count}
      </summary>
      {count > 0 ? <div className="mt-2 overflow-x-auto text-sm">{children}</div> : null}
    </details>
  );
}

const more = (n: number) => (n > MAX_LISTED ? <p className="mt-1 text-xs text-board-700">… and {n - MAX_LISTED} more.</p> : null);
const kn = (n: number) => `${n.toFixed(1)} kN`;

export function RevisionComparisonView({ projectId, comparison: c }: { projectId: string; comparison: RevisionComparison }) {
  const memberChanges = c.members.added.length + c.members.removed.length + c.members.resized.length;
  const clashChanges = c.clashes.added.length + c.clashes.resolved.length + c.clashes.needsAnotherLook.length;
  return (
    <div className="flex flex-col gap-3" data-testid="comparison">
      <p className="text-sm text-board-700">
        Revision {c.from} → revision {c.to}.{" "}
        <Link className="underline" href={`/projects/${projectId}/viewer?revision=${c.to}`}>
          Open revision {c.to} in 3D
        </Link>
      </p>
      {c.notes.map((note) => (
        <p key={note} className="rounded border border-compression/50 bg-compression/10 p-2 text-sm" data-testid="comparison-note">
          {note}
        </p>
      ))}
      <Section title="Members added, removed or resized" count={memberChanges} testId="comparison-members">
        <ul className="flex flex-col gap-1">
          {c.members.added.slice(0, MAX_LISTED).map((id) => <li key={`a-${id}`}>Added <span className="font-mono">{id}</span></li>)}
          {c.members.removed.slice(0, MAX_LISTED).map((id) => <li key={`r-${id}`}>Removed <span className="font-mono">{id}</span></li>)}
          {c.members.resized.slice(0, MAX_LISTED).map((m) => (
            <li key={`s-${m.memberId}`}>
              Resized <span className="font-mono">{m.memberId}</span>: {m.from} → {m.to}
            </li>
          ))}
        </ul>
        {more(Math.max(c.members.added.length, c.members.removed.length, c.members.resized.length))}
      </Section>
      {c.results.map((r) => (
        <Section key={r.id} title={`Force state changed in ${r.id} (${r.name})`} count={r.changes.length} testId={`comparison-result-${r.id}`}>
          <table className="w-full">
            <thead className="text-left text-xs uppercase text-board-700">
              <tr><th>Member</th><th>Revision {c.from}</th><th>Revision {c.to}</th></tr>
            </thead>
            <tbody>
              {r.changes.slice(0, MAX_LISTED).map((ch) => (
                <tr key={ch.memberId} className="border-t border-board-100">
                  <td className="font-mono">{ch.memberId}</td>
                  <td>{ch.a.state} ({kn(ch.a.force)})</td>
                  <td>{ch.b.state} ({kn(ch.b.force)})</td>
                </tr>
              ))}
            </tbody>
          </table>
          {more(r.changes.length)}
        </Section>
      ))}
      {c.resultsNotCompared.length > 0 ? (
        <p className="text-sm text-board-700">Only in one of the revisions, so not compared: {c.resultsNotCompared.join(", ")}.</p>
      ) : null}
      <Section title="Verdict changed" count={c.verdicts.length} testId="comparison-verdicts">
        <ul className="flex flex-col gap-1">
          {c.verdicts.slice(0, MAX_LISTED).map((v) => (
            <li key={v.memberId}>
              <span className="font-mono">{v.memberId}</span>: {v.from} → {v.to}
            </li>
          ))}
        </ul>
        {more(c.verdicts.length)}
      </Section>
      <Section title="Clashes added, resolved or needing another look" count={clashChanges} testId="comparison-clashes">
        <ul className="flex flex-col gap-1">
          {c.clashes.added.map((k) => <li key={`a-${k.clashKey}`}>Added: {k.memberId} × {k.runId}</li>)}
          {c.clashes.resolved.map((k) => <li key={`r-${k.clashKey}`}>Resolved: {k.memberId} × {k.runId} ({k.why})</li>)}
          {c.clashes.needsAnotherLook.map((k) => (
            <li key={`n-${k.clashKey}`} className="text-board-900">
              <strong>Needs another look:</strong> {k.memberId} × {k.runId}: {k.recheckReason}
            </li>
          ))}
        </ul>
      </Section>
    </div>
  );
}
