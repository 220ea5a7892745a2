// Everything the review report shows, read for a report job: the revision with its stored analysis and review,
// who made it current, the hash of its stored model bytes, its clashes with their decision history, the records of
// the project's threads (proposals, decisions, supersessions) and its open questions. The job checked nothing here that the request did not check first; a revision
// changed meanwhile (it cannot: revisions are immutable) or removed fails the job with a reason.
import { createHash } from "node:crypto";
import { getLatestAuditEvent } from "../../db/queries/audit";
import { listClashesByRevision, listClashHistory, type ClashHistoryEntry } from "../../db/queries/clashes";
import { listProjectThreadSteps, type ThreadStepEntry } from "../../db/queries/comments";
import { getRevisionWithResults } from "../../db/queries/models";
import { listPinsByProject } from "../../db/queries/pins";
import { getProjectById } from "../../db/queries/projects";
import { getUserById } from "../../db/queries/users";
import { CLASH_ENTRY_LABELS, CLASH_OUTCOME_LABELS } from "../../lib/clash/outcomes";
import { readModelOriginals } from "../../lib/commands/stored-files";
import { ROLE_LABELS, isRole } from "../../lib/permissions";
import type { Anchor } from "../../lib/realtime/events";
import type { ReportJobInput } from "../../lib/report/schemas";
import type { ReportClashStep, ReportIdentity, ReportInput, ReportThread, ReportThreadStep } from "../../lib/report/types";
import type { PresentedPin } from "../../lib/realtime/events";

function anchorText(anchor: Anchor): string {
  if (anchor.kind === "point") return `point (${anchor.point.map((v) => v.toFixed(2)).join(", ")})`;
  return `${anchor.kind} ${anchor.id}`;
}

const sha256 = (bytes: Uint8Array | string) => createHash("sha256").update(bytes).digest("hex");

function historyStep(entry: ClashHistoryEntry): ReportClashStep {
  return {
    step: CLASH_ENTRY_LABELS[entry.kind],
    outcome: entry.outcome ? CLASH_OUTCOME_LABELS[entry.outcome] : null,
    by: entry.decidedBy,
    role: roleLabel(entry.role),
    revision: entry.revision,
    at: entry.createdAt,
    text: [entry.note, entry.conditions ? `Conditions: ${entry.conditions}` : "", entry.reason ? `Reason: ${entry.reason}` : ""].filter(Boolean).join(" "),
  };
}

const roleLabel = (role: string | null) => (role && isRole(role) ? ROLE_LABELS[role] : role);

function threadStep(entry: ThreadStepEntry, all: ThreadStepEntry[]): ReportThreadStep {
  const superseded = entry.supersedesId ? all.find((e) => e.id === entry.supersedesId) : undefined;
  return {
    step: CLASH_ENTRY_LABELS[entry.kind],
    by: entry.author,
    role: roleLabel(entry.role),
    at: entry.createdAt,
    judgedOn: { revision: entry.revision, analysedAt: entry.analysedAt },
    text: entry.kind === "supersession" ? `Reason: ${entry.body}` : entry.body,
    conditions: entry.conditions,
    supersedes: superseded ? { by: superseded.author, at: superseded.createdAt } : null,
    caution: entry.caution,
  };
}

/** The threads whose record has steps, in the pins' order, each with its steps oldest first. */
function threadsWithSteps(pins: PresentedPin[], steps: ThreadStepEntry[]): ReportThread[] {
  return pins.flatMap((pin) => {
    const own = steps.filter((s) => s.pinId === pin.id);
    return own.length ? [{ title: pin.title, anchor: anchorText(pin.anchor), state: pin.state, steps: own.map((s) => threadStep(s, own)) }] : [];
  });
}

/** The report's input for a job; throws with a reason the team can act on when the revision or its analysis is gone. */
export async function collectReport(job: { projectId: string; revisionId: string; requestedBy: string }, query: ReportJobInput, now: Date): Promise<ReportInput> {
  const project = await getProjectById({ projectId: job.projectId });
  if (!project) throw new Error("the project no longer exists.");
  const revision = await getRevisionWithResults({ projectId: job.projectId, number: query.revision });
  if (!revision || revision.id !== job.revisionId) throw new Error(`revision ${query.revision} no longer exists.`);
  if (!revision.analysis || revision.analysis.status !== "ok") throw new Error(`revision ${query.revision} has no stable analysis stored.`);
  const requester = await getUserById({ id: job.requestedBy });

  const originals = await readModelOriginals({ projectId: job.projectId, revisionId: revision.id });
  const madeCurrent = await getLatestAuditEvent({ projectId: job.projectId, action: "revision.markCurrent", subjectId: revision.id });
  const identity: ReportIdentity = {
    isCurrent: revision.isCurrent,
    madeCurrent,
    hashes: originals.length
      ? originals.map((file) => ({ of: `uploaded file ${file.filename} (${file.bytes.byteLength} bytes)`, sha256: sha256(file.bytes) }))
      : [{ of: "the stored model JSON (generated revision, no uploaded file)", sha256: sha256(JSON.stringify(revision.model)) }],
  };

  const clashes = await listClashesByRevision({ revisionId: revision.id });
  const history = await listClashHistory({ projectId: job.projectId, clashKeys: clashes.map((c) => c.clashKey) });
  const pins = await listPinsByProject({ projectId: job.projectId });
  const threadSteps = await listProjectThreadSteps({ projectId: job.projectId });
  return {
    project: { name: project.name, description: project.description },
    revision: { number: revision.number, name: revision.name, createdAt: revision.createdAt, createdBy: revision.createdBy },
    identity,
    model: revision.model,
    result: revision.analysis.result,
    review: revision.analysis.review,
    combinations: query.combinations,
    compare: query.compare,
    clashes: clashes.map((c) => ({
      clashKey: c.clashKey,
      memberId: c.memberId,
      runId: c.runId,
      kind: c.kind,
      status: c.status,
      outcome: c.outcome ? CLASH_OUTCOME_LABELS[c.outcome] : null,
      note: c.note,
      conditions: c.conditions,
      proposedBy: c.proposedBy,
      decidedBy: c.decidedBy,
      decidedAt: c.decidedAt,
      point: c.point,
      history: history.filter((h) => h.clashKey === c.clashKey).map(historyStep),
    })),
    threads: threadsWithSteps(pins, threadSteps),
    openQuestions: pins
      .filter((pin) => pin.state !== "closed")
      .map((pin) => ({ title: pin.title, anchor: anchorText(pin.anchor), state: pin.state as "open" | "answered", author: pin.author.name, createdAt: pin.createdAt, comments: pin.commentCount })),
    generatedAt: now.toISOString(),
    generatedBy: requester?.name ?? "a former member",
  };
}
