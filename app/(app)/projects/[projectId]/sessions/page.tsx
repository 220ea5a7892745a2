import type { Metadata } from "next";
import Link from "next/link";
import { BcfImportForm } from "@/components/session/bcf-import-form";
import { listPinsByProject } from "@/db/queries/pins";
import { getLiveSession } from "@/db/queries/review-sessions";
import { requirePageProject } from "@/lib/auth/page";
import { anchorLabel } from "@/lib/realtime/anchors";
import { DISCIPLINES, PIN_STATES, pinFilterSchema } from "@/lib/realtime/events";

export const metadata: Metadata = { title: "Review sessions" };

/** The review overview: whether a session is live, and every pinned question with its thread state. */
export default async function SessionsPage({ params, searchParams }: PageProps<"/projects/[projectId]/sessions">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId);
  // Unknown filter values are ignored here (a link may be old); the API answers them with a 400.
  const parsed = pinFilterSchema.safeParse(await searchParams);
  const filter = parsed.success ? parsed.data : {};
  const [session, pins] = await Promise.all([getLiveSession({ projectId }), listPinsByProject({ projectId, filter })]);
  const viewerUrl = (pinId?: string) => `/projects/${project.id}/viewer${pinId ? `?pin=${pinId}` : ""}`;
  const filterUrl = (patch: Record<string, string | undefined>) => {
    const query = new URLSearchParams(Object.entries({ ...filter, ...patch }).filter((e): e is [string, string] => Boolean(e[1])));
    return `/projects/${project.id}/sessions${query.size ? `?${query}` : ""}`;
  };

  return (
    <div className="flex flex-col gap-4">
      <section className="rounded-xl border border-board-200 bg-white p-4" data-testid="live-session-summary">
        {session ? (
          <p>
            <span className="font-medium">{session.presenterName}</span> has been presenting since {new Date(session.startedAt).toLocaleTimeString("en-GB")}.{" "}
            <Link className="text-tension underline" href={viewerUrl()}>
              Join the review session
            </Link>
          </p>
        ) : (
          <p>
            No review session is live. The owner or the structural engineer starts one from the{" "}
            <Link className="text-tension underline" href={viewerUrl()}>
              3D viewer
            </Link>
            ; everyone else can join there.
          </p>
        )}
      </section>
      {project.abilities["pin.create"] && project.abilities["comment.create"] && (
        <section className="rounded-xl border border-board-200 bg-white p-4" aria-labelledby="bcf-import-heading">
          <h2 id="bcf-import-heading" className="mb-2 font-semibold">
            Import pins from BCF
          </h2>
          <BcfImportForm projectId={project.id} />
        </section>
      )}
      <section className="flex flex-col gap-2" aria-label="Pinned questions">
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <span className="font-medium">Pins</span>
          {[undefined, ...PIN_STATES].map((state) => (
            <Link key={state ?? "all"} href={filterUrl({ state })} className={`rounded-full border px-2 py-0.5 ${filter.state === state ? "border-board-800 bg-board-800 text-white" : "border-board-200 bg-white"}`}>
              {state ?? "any state"}
            </Link>
          ))}
          <span className="mx-1 text-board-700">·</span>
          {[undefined, ...DISCIPLINES].map((discipline) => (
            <Link key={discipline ?? "all"} href={filterUrl({ discipline })} className={`rounded-full border px-2 py-0.5 ${filter.discipline === discipline ? "border-board-800 bg-board-800 text-white" : "border-board-200 bg-white"}`}>
              {discipline ?? "any discipline"}
            </Link>
          ))}
        </div>
        {pins.length === 0 ? (
          <p className="text-sm text-board-700">No pins here yet.</p>
        ) : (
          // a phone is narrower than the six columns and a pin's anchor: the table scrolls inside its own box
          <div className="overflow-x-auto rounded-xl">
            <table className="w-full border-collapse bg-white text-sm" data-testid="sessions-pin-table">
              <thead>
                <tr className="border-b border-board-200 text-left text-board-700">
                  <th className="p-2">Question</th>
                  <th className="p-2">On</th>
                  <th className="p-2">State</th>
                  <th className="p-2">Discipline</th>
                  <th className="p-2">Raised by</th>
                  <th className="p-2 text-right">Comments</th>
                </tr>
              </thead>
              <tbody>
                {pins.map((pin) => (
                  <tr key={pin.id} className="border-b border-board-100">
                    <td className="p-2">
                      <Link className="text-tension underline" href={viewerUrl(pin.id)}>
                        {pin.title}
                      </Link>
                    </td>
                    <td className="p-2 font-mono text-xs">{anchorLabel(pin.anchor)}</td>
                    <td className="p-2">{pin.state}</td>
                    <td className="p-2">{pin.discipline}</td>
                    <td className="p-2">{pin.author.name}</td>
                    <td className="p-2 text-right">{pin.commentCount}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
