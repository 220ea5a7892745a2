// Issue 16, item 2: a new revision carries each proposed or decided clash. Unchanged member, run and results: the
// decision is kept. Changed results: "needs another look" with the reason in words, and the decider is mailed.
// Changed member or run (moved, resized, gone), on the new revision or by an edit of the run: the decision is closed
// with the reason, and the decider is mailed. Uses the generated 9 m × 9 m roof and one duct along x at
// y = 1.5 m through the y-direction top chords (the geometry of tests/integration/mep-clashes-api.test.ts).
import { and, eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listClashesByRevision, listClashHistory } from "@/db/queries/clashes";
import { claimJob } from "@/db/queries/jobs";
import { getMemberResults } from "@/db/queries/member-snapshots";
import { importRuns } from "@/lib/commands/import-runs";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { mailOutbox } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { UTILISATION_TOLERANCE } from "@/lib/clash/carry";
import type { TrussModel } from "@/lib/analysis/model";
import { decideClash } from "@/lib/commands/decide-clash";
import { deleteRun } from "@/lib/commands/delete-run";
import { editRun } from "@/lib/commands/edit-run";
import { storeAnalysis } from "@/lib/commands/store-analysis";
import { proposeClashOutcome } from "@/lib/commands/propose-clash-outcome";
import { supersedeClashDecision } from "@/lib/commands/supersede-clash-decision";
import type { Run } from "@/lib/mep/schemas";
import { analyseForStorage } from "@/lib/models/analyse";
import { jsonBytes } from "@/lib/models/json-bytes";
import { encodeResultColumns } from "@/lib/models/result-columns";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { deriveRevision } from "../support/derived-revision";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";

let fx: ProjectFixture;
let base: TrussModel;
let first: { id: string; number: number };
const MEMBER = "TCY-1-0";
const duct: Run = { id: "SA-01", system: "supply air", profile: { shape: "round", diameter: 0.5 }, insulation: 0.05, clearance: 0.1, weightPerMetre: 0.35, points: [{ x: -1, y: 1.5, z: 2 }, { x: 10, y: 1.5, z: 2 }] } as Run;

// The product's path: the revision is stored with the runs carried (decisions copied or closed), then the jobs
// process stores its analysis, which re-checks the carried decisions.
async function derive(name: string, model: TrussModel, from: { id: string } = first) {
  const { revision, analysisJob: job } = await deriveRevision({ projectId: fx.projectId, createdBy: fx.users.structural_engineer.id, fromRevisionId: from.id, name, model });
  expect(await claimJob({ jobId: job.id })).not.toBeNull();
  const { result, review } = analyseForStorage(model, "EN1993-1-1");
  const stored = { status: result.status, resultJson: jsonBytes(result), reviewJson: review && jsonBytes(review), columns: encodeResultColumns(model, result, review) };
  expect(await storeAnalysis({ job: { id: job.id, projectId: fx.projectId, revisionId: revision.id }, ...stored, outcome: null })).toBe(true);
  return revision;
}
const memberReview = async (revisionId: string) => (await getMemberResults({ db: getDb(), revisionId, memberIds: [MEMBER] })).get(MEMBER)!;
const maxTension = (r: { results: Record<string, { force: number }> }) => Math.max(0, ...Object.values(r.results).map((x) => x.force));
const maxCompression = (r: { results: Record<string, { force: number }> }) => Math.max(0, ...Object.values(r.results).map((x) => -x.force));
const clashOn = async (revisionId: string) => (await listClashesByRevision({ revisionId })).find((c) => c.memberId === MEMBER)!;
const mailsAbout = (clashKey: string, kind: "recheck" | "decision") =>
  getDb()
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.kind, kind), like(mailOutbox.subject, `%${clashKey}%`)));

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("clash-carry");
  base = generateRoof({ name: "Carry roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
  const { result, review } = analyseForStorage(base, "EN1993-1-1");
  first = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "r1", model: base, source: "generated", createdBy: fx.users.structural_engineer.id, result, review });
  await importRuns({ projectId: fx.projectId, revision: { ...first, model: base }, runs: [duct], mode: "replace", actorId: fx.users.mep_engineer.id });
  const clash = await clashOn(first.id);
  await proposeClashOutcome({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.mep_engineer.id, role: "mep_engineer" }, input: { outcome: "opening_proposed", note: "" } });
  await decideClash({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.structural_engineer.id, role: "structural_engineer" }, input: { outcome: "opening_accepted", conditions: "Sleeved opening at mid-length, 250 mm." } });
});
afterAll(closeDb);

describe("carrying decisions to a new revision", () => {
  it("keeps the decision, without another look, when member, run and results are unchanged", async () => {
    const same = await derive("r2 same", structuredClone(base));
    const clash = await clashOn(same.id);
    expect(clash).toMatchObject({ outcome: "opening_accepted", conditions: "Sleeved opening at mid-length, 250 mm.", decidedBy: fx.users.structural_engineer.name, recheckReason: null, status: "active" });
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [clash.clashKey] });
    expect(history.map((h) => h.kind)).toEqual(["proposal", "decision"]);
  });

  it("marks it 'needs another look', with the reason in words, when the member's forces change; the decider is mailed", async () => {
    const loaded = structuredClone(base);
    const member = loaded.members.find((m) => m.id === MEMBER)!;
    // A 500 kN pull along the chord at its far joint, as a new load case and combination: the chord must work
    // (200 kN moved its utilisation by 0.03 only, within the tolerance).
    loaded.loadCases.push({ id: "PULL", name: "Test pull", category: "live", selfWeight: false, nodalLoads: [{ node: member.j, fx: 0, fy: 500, fz: 0 }] } as TrussModel["loadCases"][number]);
    loaded.combinations.push({ id: "C-PULL", name: "Pull only", factors: { PULL: 1 } });
    const revision = await derive("r3 pulled", loaded);
    const clash = await clashOn(revision.id);
    expect(clash.outcome).toBe("opening_accepted");
    // The reason in full, from the member's stored results on each revision: its largest tension (the pull's
    // combination now) and its utilisation beyond the tolerance (the pull must move it that far, or this case tests
    // nothing); its verdict stays load-bearing, so it is not named.
    const [then, now] = [await memberReview(first.id), await memberReview(revision.id)];
    expect(Math.abs(now.utilisation! - then.utilisation!)).toBeGreaterThan(UTILISATION_TOLERANCE);
    expect([then.verdict, now.verdict]).toEqual(["load-bearing", "load-bearing"]);
    expect(clash.recheckReason).toBe(`${MEMBER} maximum tension changed from ${maxTension(then).toFixed(1)} kN to ${maxTension(now).toFixed(1)} kN; utilisation went from ${then.utilisation!.toFixed(2)} to ${now.utilisation!.toFixed(2)}.`);
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [clash.clashKey] });
    const recheck = history.filter((h) => h.kind === "recheck" && h.revision === revision.number);
    expect(recheck).toHaveLength(1);
    expect(recheck[0].reason).toBe(clash.recheckReason);
    const mails = await mailsAbout(clash.clashKey, "recheck");
    expect(mails.map((m) => m.toAddress)).toEqual([fx.users.structural_engineer.email]);
    expect(mails[0].textBody).toContain(clash.recheckReason!);
  });

  it("names the verdict when the member's verdict changed (unloaded, the chord carries nothing)", async () => {
    const unloaded = structuredClone(base);
    for (const loadCase of unloaded.loadCases) Object.assign(loadCase, { selfWeight: false, nodalLoads: [] });
    const revision = await derive("r7 unloaded", unloaded);
    const clash = await clashOn(revision.id);
    expect(clash.outcome).toBe("opening_accepted");
    const [then, now] = [await memberReview(first.id), await memberReview(revision.id)];
    expect([then.verdict, now.verdict]).toEqual(["load-bearing", "idle"]);
    // Unloaded, it carries nothing and has no utilisation: its envelope and its verdict are named, in full.
    expect(now.utilisation).toBeNull();
    expect(clash.recheckReason).toBe(
      `${MEMBER} maximum tension changed from ${maxTension(then).toFixed(1)} kN to 0.0 kN; ${MEMBER} maximum compression changed from ${maxCompression(then).toFixed(1)} kN to 0.0 kN; its verdict was load-bearing; now idle.`,
    );
  });

  it("closes the decision, with the reason, when the member changed section", async () => {
    const resized = structuredClone(base);
    const member = resized.members.find((m) => m.id === MEMBER)!;
    const section = resized.sections.find((s) => s.id === member.section)!;
    resized.sections.push({ ...section, id: "CHS-TEST-BIGGER", area: section.area * 2 });
    member.section = "CHS-TEST-BIGGER";
    const revision = await derive("r4 resized", resized);
    const clash = await clashOn(revision.id);
    expect(clash).toMatchObject({ outcome: null, decidedBy: null });
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [clash.clashKey] });
    const closure = history.find((h) => h.kind === "closure" && h.revision === revision.number);
    expect(closure?.reason).toBe(`The decision does not carry: member ${MEMBER} changed section in revision ${revision.number} (${section.id} → CHS-TEST-BIGGER).`);
  });

  it("names the opening check when an accepted opening's hole would now work differently", async () => {
    // A 30 mm heating pipe (10 mm insulation) along x at y = 4.5 m through the y-direction top chords TCY-*-1: its
    // opening through TCY-1-1 is accepted on revision 1, then the chord is pulled hard in a new combination.
    const pipe = { ...duct, id: "HW-T1", system: "heating", profile: { shape: "round", diameter: 0.03 }, insulation: 0.01, clearance: 0.02, points: [{ x: -1, y: 4.5, z: 2 }, { x: 10, y: 4.5, z: 2 }] } as Run;
    await importRuns({ projectId: fx.projectId, revision: { ...first, model: base }, runs: [pipe], mode: "upsert", actorId: fx.users.mep_engineer.id });
    const onChord = async (revisionId: string) => (await listClashesByRevision({ revisionId })).find((c) => c.memberId === "TCY-1-1" && c.runId === "HW-T1")!;
    const clash = await onChord(first.id);
    await proposeClashOutcome({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.mep_engineer.id, role: "mep_engineer" }, input: { outcome: "opening_proposed", note: "" } });
    await decideClash({ projectId: fx.projectId, clashId: clash.id, actor: { userId: fx.users.structural_engineer.id, role: "structural_engineer" }, input: { outcome: "opening_accepted", conditions: "Sleeved hole of 50 mm at the clash point only." } });
    const pulled = structuredClone(base);
    const chord = pulled.members.find((m) => m.id === "TCY-1-1")!;
    pulled.loadCases.push({ id: "PULL", name: "Test pull", category: "live", selfWeight: false, nodalLoads: [{ node: chord.j, fx: 0, fy: 200, fz: 0 }] } as TrussModel["loadCases"][number]);
    pulled.combinations.push({ id: "C-PULL", name: "Pull only", factors: { PULL: 1 } });
    const revision = await derive("r6 pipe pulled", pulled);
    const carried = await onChord(revision.id);
    expect(carried.outcome).toBe("opening_accepted");
    expect(carried.recheckReason).toMatch(/the opening check \(a 50 mm hole at \d+\.\d\d m\) (was "within capacity on the checks made"; now "over capacity"|went from utilisation \d\.\d\d to \d+\.\d\d)/);
  });

  it("closes the decision, with the reason, when the member moved", async () => {
    const shifted = structuredClone(base);
    const end = shifted.nodes.find((n) => n.id === shifted.members.find((m) => m.id === MEMBER)!.j)!;
    end.x += 0.01;
    const revision = await derive("r8 shifted joint", shifted);
    const [key] = (await listClashesByRevision({ revisionId: first.id })).filter((c) => c.memberId === MEMBER).map((c) => c.clashKey);
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [key] });
    const closure = history.filter((h) => h.kind === "closure" && h.revision === revision.number);
    expect(closure.map((h) => [h.reason, h.outcome])).toEqual([[`The decision does not carry: member ${MEMBER} moved in revision ${revision.number}.`, "opening_accepted"]]);
    expect((await listClashesByRevision({ revisionId: revision.id })).find((c) => c.clashKey === key)).toMatchObject({ outcome: null, decidedBy: null });
  });

  it("closes the decision, with the reason, when the MEP engineer moves the run on the new revision; the decider is mailed", async () => {
    const revision = await derive("r9 duct to be moved", structuredClone(base));
    const carried = await clashOn(revision.id);
    expect(carried).toMatchObject({ outcome: "opening_accepted", status: "active" });
    // 50 mm higher: the duct still passes through the chord (same clash id, so its thread stays), but the opening was
    // accepted for the duct where it was.
    await editRun({ projectId: fx.projectId, revision: { ...revision, model: base }, runId: duct.id, edit: { points: duct.points.map((p) => ({ ...p, z: p.z + 0.05 })) }, actorId: fx.users.mep_engineer.id });
    const reason = `The decision no longer holds: run ${duct.id} was moved or resized in revision ${revision.number}.`;
    const after = await clashOn(revision.id);
    expect(after).toMatchObject({ id: carried.id, clashKey: carried.clashKey, status: "active", outcome: null, conditions: null, decidedBy: null, proposedBy: null, closedReason: null });
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [carried.clashKey] });
    expect(history.filter((h) => h.revision === revision.number).map((h) => [h.kind, h.outcome, h.reason])).toEqual([["closure", "opening_accepted", reason]]);
    // The decision it closes stays in the history, and on the revision it was made on.
    expect(history.filter((h) => h.kind === "decision").map((h) => [h.revision, h.conditions])).toEqual([[1, "Sleeved opening at mid-length, 250 mm."]]);
    expect((await clashOn(first.id)).outcome).toBe("opening_accepted");
    const mails = (await mailsAbout(carried.clashKey, "decision")).filter((m) => m.textBody.includes(reason));
    expect(mails.map((m) => m.toAddress)).toEqual([fx.users.structural_engineer.email]);
    expect(mails[0].subject).toMatch(new RegExp(`^Decision closed on clash ${carried.clashKey} \\(member ${MEMBER}, run ${duct.id}\\): opening accepted with conditions \\(Fixture roof clash-carry `));
    // A new proposal can now be made on the clash as it is.
    await proposeClashOutcome({ projectId: fx.projectId, clashId: after.id, actor: { userId: fx.users.mep_engineer.id, role: "mep_engineer" }, input: { outcome: "reroute_run", note: "" } });
  });

  it("closes the clash, with the reason, when the run is removed from the new revision", async () => {
    const revision = await derive("r10 duct to be removed", structuredClone(base));
    const carried = await clashOn(revision.id);
    expect(carried.outcome).toBe("opening_accepted");
    await deleteRun({ projectId: fx.projectId, revision: { ...revision, model: base }, runId: duct.id, actorId: fx.users.mep_engineer.id });
    const reason = `The decision no longer holds: run ${duct.id} is not on revision ${revision.number}.`;
    expect(await clashOn(revision.id)).toMatchObject({ id: carried.id, status: "closed", closedReason: reason, outcome: null, decidedBy: null });
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [carried.clashKey] });
    expect(history.filter((h) => h.revision === revision.number).map((h) => [h.kind, h.reason])).toEqual([["closure", reason]]);
    expect((await mailsAbout(carried.clashKey, "decision")).filter((m) => m.textBody.includes(reason)).map((m) => m.toAddress)).toEqual([fx.users.structural_engineer.email]);
    // Closed: a proposal on it is refused with the reason.
    await expect(proposeClashOutcome({ projectId: fx.projectId, clashId: carried.id, actor: { userId: fx.users.mep_engineer.id, role: "mep_engineer" }, input: { outcome: "reroute_run", note: "" } })).rejects.toThrow(reason);
  });

  it("closes the decision, with the reason, when the member is gone", async () => {
    const without = structuredClone(base);
    without.members = without.members.filter((m) => m.id !== MEMBER);
    const revision = await derive("r5 without the chord", without);
    expect((await listClashesByRevision({ revisionId: revision.id })).some((c) => c.memberId === MEMBER && c.status !== "closed")).toBe(false);
    const [key] = (await listClashesByRevision({ revisionId: first.id })).filter((c) => c.memberId === MEMBER).map((c) => c.clashKey);
    const history = await listClashHistory({ projectId: fx.projectId, clashKeys: [key] });
    const closure = history.find((h) => h.kind === "closure" && h.revision === revision.number);
    expect(closure?.reason).toBe(`The decision does not carry: member ${MEMBER} is not in revision ${revision.number}.`);
    // The decision it closes stays in the history, unchanged.
    expect(history.filter((h) => h.kind === "decision").map((h) => h.conditions)).toEqual(["Sleeved opening at mid-length, 250 mm."]);
  });

  it("says when a member that was zero in every combination now carries force, naming the result (the issue's own example)", async () => {
    // Last, as it judges the clash again on a later revision (the cases above compare with revision 1). Judged on an
    // unloaded revision (the chord zero everywhere): the structural engineer supersedes the carried decision and the
    // opening is proposed and accepted again there; the next revision loads the roof again.
    const unloaded = structuredClone(base);
    for (const loadCase of unloaded.loadCases) Object.assign(loadCase, { selfWeight: false, nodalLoads: [] });
    const idle = await derive("r11 unloaded, judged here", unloaded);
    const clash = await clashOn(idle.id);
    const [structural, mep] = [{ userId: fx.users.structural_engineer.id, role: "structural_engineer" as const }, { userId: fx.users.mep_engineer.id, role: "mep_engineer" as const }];
    await supersedeClashDecision({ projectId: fx.projectId, clashId: clash.id, actor: structural, input: { reason: "Judged again on the unloaded revision." } });
    await proposeClashOutcome({ projectId: fx.projectId, clashId: clash.id, actor: mep, input: { outcome: "opening_proposed", note: "" } });
    await decideClash({ projectId: fx.projectId, clashId: clash.id, actor: structural, input: { outcome: "opening_accepted", conditions: "Sleeved opening, zero-force chord only." } });
    const loaded = await derive("r12 loaded again", structuredClone(base), idle);
    const carried = await clashOn(loaded.id);
    expect(carried).toMatchObject({ outcome: "opening_accepted", conditions: "Sleeved opening, zero-force chord only." });
    const [then, now] = [await memberReview(idle.id), await memberReview(loaded.id)];
    expect(Object.values(then.results).every((r) => r.zero)).toBe(true);
    const [worstId, worst] = Object.entries(now.results).reduce((a, b) => (Math.abs(b[1].force) > Math.abs(a[1].force) ? b : a));
    const name = [...base.loadCases, ...base.combinations].find((r) => r.id === worstId)!.name;
    expect(carried.recheckReason).toBe(`${MEMBER} was zero in every combination; now carries ${Math.abs(worst.force).toFixed(1)} kN ${worst.force < 0 ? "compression" : "tension"} in ${name}; its verdict was idle; now load-bearing.`);
  });
});
