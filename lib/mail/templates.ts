// The mails Strutroom sends: plain and clear, each with a text part and a simple HTML part built from the same
// lines. Pure functions (no I/O), so they are tested on their own.
import escapeHtml from "escape-html";
import { ROLE_LABELS, type Role } from "../permissions";

export type RenderedMail = { subject: string; text: string; html: string };

/** The standing caution (glossary.md), carried by every mail about a clash, opening or member change. */
export const STANDING_CAUTION =
  "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

type Block = { kind: "p"; text: string } | { kind: "link"; label: string; url: string } | { kind: "list"; items: string[] } | { kind: "note"; text: string };

function render(subject: string, blocks: Block[]): RenderedMail {
  const text = blocks
    .map((block) => {
      if (block.kind === "link") return `${block.label}:\n${block.url}`;
      if (block.kind === "list") return block.items.map((item) => `- ${item}`).join("\n");
      return block.text;
    })
    .concat("—\nStrutroom, the shared review board for steel space-truss roofs.")
    .join("\n\n");
  const body = blocks
    .map((block) => {
      if (block.kind === "link") {
        return `<p><a href="${escapeHtml(block.url)}" style="color:#0f766e;font-weight:600">${escapeHtml(block.label)}</a></p>`;
      }
      if (block.kind === "list") return `<ul>${block.items.map((item) => `<li>${escapeHtml(item)}</li>`).join("")}</ul>`;
      if (block.kind === "note") return `<p style="color:#475569;font-size:13px;border-left:3px solid #c2410c;padding-left:8px">${escapeHtml(block.text)}</p>`;
      return `<p>${escapeHtml(block.text)}</p>`;
    })
    .join("\n");
  const html = `<!doctype html>
<html><body style="font-family:Arial,Helvetica,sans-serif;color:#0f172a;line-height:1.5;max-width:560px">
${body}
<p style="color:#64748b;font-size:12px">Strutroom, the shared review board for steel space-truss roofs.</p>
</body></html>`;
  return { subject, text: `${text}\n`, html };
}

/** An invitation to join a project, with the join link (the only way in for a new person). */
export function invitationMail(input: { projectName: string; inviterName: string; role: Role; joinUrl: string; expiresAt: Date }): RenderedMail {
  return render(`${input.inviterName} invited you to ${input.projectName} on Strutroom`, [
    { kind: "p", text: `${input.inviterName} invited you to the project "${input.projectName}" with the role "${ROLE_LABELS[input.role]}".` },
    { kind: "link", label: "Join the project", url: input.joinUrl },
    { kind: "p", text: `The link works once and until ${input.expiresAt.toUTCString()}. If you did not expect this invitation, ignore this mail.` },
  ]);
}

/** Someone named the recipient with @ in a comment on a pin. */
export function mentionMail(input: { projectName: string; byName: string; pinTitle: string; excerpt: string; pinUrl: string }): RenderedMail {
  return render(`${input.byName} mentioned you on "${input.pinTitle}" (${input.projectName})`, [
    { kind: "p", text: `${input.byName} mentioned you in the thread "${input.pinTitle}" of ${input.projectName}:` },
    { kind: "p", text: `“${input.excerpt}”` },
    { kind: "link", label: "Open the thread", url: input.pinUrl },
  ]);
}

/** A decision recorded on a clash (its outcome) or on a proposed opening in a member. */
export function decisionMail(input: {
  projectName: string;
  deciderName: string;
  subject: string;
  outcome: string;
  note: string | null;
  /** The conditions a decision was made on, when it has any. */
  conditions?: string | null;
  url: string;
}): RenderedMail {
  const blocks: Block[] = [
    { kind: "p", text: `${input.deciderName} recorded a decision on ${input.subject} in ${input.projectName}: ${input.outcome}.` },
  ];
  if (input.conditions) blocks.push({ kind: "p", text: `Conditions: ${input.conditions}` });
  if (input.note) blocks.push({ kind: "p", text: `Note: ${input.note}` });
  blocks.push({ kind: "link", label: "See it in the model", url: input.url }, { kind: "note", text: STANDING_CAUTION });
  return render(`Decision on ${input.subject}: ${input.outcome} (${input.projectName})`, blocks);
}

/** What happened to a clash, as a mail says it: proposed, decided, superseded, flagged for another look, or closed. */
export type ClashStep = "proposal" | "decision" | "supersession" | "recheck" | "closure";

const CLASH_STEP_VERBS: Record<ClashStep, string> = {
  proposal: "proposed",
  decision: "decided",
  supersession: "superseded the decision on",
  recheck: "flagged for another look",
  closure: "closed the decision on",
};

/**
 * A step on a clash: a proposal (not yet a decision, and said so), a decision, a supersession, a re-check on a
 * newer revision, or a closure (its member or run changed or vanished). `actorName` is null for the re-checks and
 * closures Strutroom makes itself. A proposal or supersession in a pin's thread reads the same, with its own link
 * label.
 */
export function clashStepMail(input: { projectName: string; actorName: string | null; step: ClashStep; subject: string; outcome: string | null; details: string[]; url: string; linkLabel?: string }): RenderedMail {
  const verb = CLASH_STEP_VERBS[input.step];
  const what = input.outcome ? `: ${input.outcome}` : "";
  const lead =
    input.step === "recheck"
      ? `The decision on ${input.subject} in ${input.projectName} needs another look${what}.`
      : input.step === "closure"
        ? `The decision on ${input.subject} in ${input.projectName} no longer holds${what}.`
        : input.step === "supersession"
          ? `${input.actorName ?? "Someone"} ${verb} ${input.subject} in ${input.projectName}${what}.`
          : `${input.actorName ?? "Someone"} ${verb} an outcome for ${input.subject} in ${input.projectName}${what}.`;
  const blocks: Block[] = [{ kind: "p", text: lead }];
  if (input.step === "proposal") blocks.push({ kind: "p", text: "This is a proposal, not a decision: the structural engineer decides it." });
  for (const line of input.details) blocks.push({ kind: "p", text: line });
  blocks.push({ kind: "link", label: input.linkLabel ?? "See the clash", url: input.url }, { kind: "note", text: STANDING_CAUTION });
  const heading = { proposal: "Proposed", decision: "Decided", supersession: "Decision superseded", recheck: "Needs another look", closure: "Decision closed" }[input.step];
  return render(`${heading} on ${input.subject}${what} (${input.projectName})`, blocks);
}

export type DigestThread = { title: string; state: "open" | "answered"; ageDays: number; lastBy: string | null; url: string };

/** The daily digest of a project's threads that are still open or answered but not closed. */
export function digestMail(input: { projectName: string; recipientName: string; threads: DigestThread[]; projectUrl: string }): RenderedMail {
  const count = input.threads.length;
  const items = input.threads.map((thread) => {
    const age = thread.ageDays === 0 ? "today" : thread.ageDays === 1 ? "1 day" : `${thread.ageDays} days`;
    return `${thread.title} — ${thread.state}, ${age}${thread.lastBy ? `, last comment by ${thread.lastBy}` : ""}: ${thread.url}`;
  });
  return render(`${count} open thread${count === 1 ? "" : "s"} in ${input.projectName}`, [
    { kind: "p", text: `Good morning ${input.recipientName}, these threads in ${input.projectName} are not closed yet:` },
    { kind: "list", items },
    { kind: "link", label: "Open the project", url: input.projectUrl },
  ]);
}
