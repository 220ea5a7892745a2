// The opening check behind an accepted opening, as a carried decision is re-checked (issue 16 item 2: "… or the
// opening check changed"): the hole the run needs through the member at the clash point, checked on the member's
// net section across the design combinations (lib/review/opening.ts), in the revision the decision was judged on
// and in the new one. Pure.
import type { TrussModel } from "../analysis/model";
import type { Run } from "../mep/schemas";
import { designResultIds, memberDesignInputs } from "../review/member-design";
import { assessOpening, type OpeningAssessment } from "../review/opening";
import type { DesignStandard } from "../review/design-checks/types";
import { UTILISATION_TOLERANCE } from "./carry";

type Point = { x: number; y: number; z: number };

/**
 * The hole a run needs through a tube member: round, as wide as the run's insulated section (a rectangular one by
 * its diagonal, whatever its rotation — our conservative choice), centred where the clash point projects on the
 * member's axis. Null when the member is not a tube with a stated diameter and wall.
 */
export function clashOpeningCheck(input: {
  model: TrussModel;
  standard: DesignStandard;
  memberId: string;
  run: Pick<Run, "profile" | "insulation">;
  point: Point;
  /** The member's axial force (kN) and zero-force flag per result id. */
  results: Record<string, { force: number; zero: boolean }>;
}): OpeningAssessment | null {
  const { model, memberId, run, point } = input;
  const index = model.members.findIndex((m) => m.id === memberId);
  if (index < 0) return null;
  const member = memberDesignInputs(model)[index];
  if (!member.outerDiameter || !member.wallThickness) return null;
  const nodes = new Map(model.nodes.map((n) => [n.id, n]));
  const a = nodes.get(model.members[index].i)!;
  const b = nodes.get(model.members[index].j)!;
  const axis = [b.x - a.x, b.y - a.y, b.z - a.z];
  const length = Math.hypot(axis[0], axis[1], axis[2]);
  const position = ((point.x - a.x) * axis[0] + (point.y - a.y) * axis[1] + (point.z - a.z) * axis[2]) / length;
  const bare = run.profile.shape === "round" ? run.profile.diameter : Math.hypot(run.profile.width, run.profile.height);
  const forces = designResultIds(model)
    .filter((id) => input.results[id])
    .map((id) => ({ combination: id, force: input.results[id].zero ? 0 : input.results[id].force }));
  return assessOpening({
    standard: input.standard,
    member: { ...member, outerDiameter: member.outerDiameter, wallThickness: member.wallThickness },
    opening: { shape: "round", diameter: bare + 2 * (run.insulation ?? 0), position },
    forces,
  });
}

const mm = (m: number) => `${Math.round(m * 1000)} mm`;
const governing = (a: OpeningAssessment) => a.governing?.utilisationWith ?? null;

/** Why the opening check of an accepted opening needs another look, in words, or null when it holds. */
export function openingCheckReason(before: OpeningAssessment, after: OpeningAssessment): string | null {
  const hole = `the opening check (a ${mm(after.opening.shape === "round" ? after.opening.diameter : after.opening.widthAcross)} hole at ${after.opening.position.toFixed(2)} m)`;
  if (before.verdict !== after.verdict) return `${hole} was "${before.verdict}"; now "${after.verdict}"`;
  const [u0, u1] = [governing(before), governing(after)];
  if (u0 !== null && u1 !== null && Math.abs(u1 - u0) > UTILISATION_TOLERANCE) return `${hole} went from utilisation ${u0.toFixed(2)} to ${u1.toFixed(2)}`;
  return null;
}
