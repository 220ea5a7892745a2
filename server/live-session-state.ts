// Who presents in each project, read from PostgreSQL and cached for a moment (camera events arrive ten times a
// second), and the presenter's latest view written behind at most once a second. Both are rebuilt from the
// database after a restart; nothing here is the only copy of anything.
import { getLiveSession, saveSessionView } from "@/db/queries/review-sessions";
import type { SessionView } from "@/lib/realtime/events";

const PRESENTER_TTL_MS = 1000;
const VIEW_WRITE_INTERVAL_MS = 1000;

const presenters = new Map<string, { presenterId: string | null; expires: number }>();
const pendingViews = new Map<string, { presenterId: string; view: SessionView; timer: NodeJS.Timeout }>();

/** The id of the project's presenter, or null when no session is live. */
export async function presenterOf(projectId: string): Promise<string | null> {
  const cached = presenters.get(projectId);
  if (cached && cached.expires > Date.now()) return cached.presenterId;
  const session = await getLiveSession({ projectId });
  const presenterId = session?.presenterId ?? null;
  presenters.set(projectId, { presenterId, expires: Date.now() + PRESENTER_TTL_MS });
  return presenterId;
}

/** Forgets the cached presenter after a start, handover or end on this node. */
export function forgetPresenter(projectId: string): void {
  presenters.delete(projectId);
}

async function writeView(projectId: string) {
  const pending = pendingViews.get(projectId);
  if (!pending) return;
  pendingViews.delete(projectId);
  try {
    await saveSessionView({ projectId, presenterId: pending.presenterId, view: pending.view });
  } catch (error) {
    console.error("[realtime] could not save the presenter's view", error);
  }
}

/** Queues the presenter's view to be stored (the last one within each second wins). */
export function rememberView(projectId: string, presenterId: string, view: SessionView): void {
  const pending = pendingViews.get(projectId);
  if (pending) {
    pending.view = view;
    pending.presenterId = presenterId;
    return;
  }
  const timer = setTimeout(() => void writeView(projectId), VIEW_WRITE_INTERVAL_MS);
  pendingViews.set(projectId, { presenterId, view, timer });
}

/** Writes every queued view now (shutdown). */
export async function flushViews(): Promise<void> {
  const projectIds = [...pendingViews.keys()];
  for (const id of projectIds) clearTimeout(pendingViews.get(id)!.timer);
  await Promise.all(projectIds.map(writeView));
}
