// A project as one member sees it: the project plus their role and what the rule book lets that role do.
import { abilitiesOf, type Action, type Role } from "@/lib/permissions";
import type { COMBINATION_STANDARDS, DESIGN_STANDARDS } from "./standards";

/** A project as the API presents it (db/queries/projects.ts builds it from its rows). */
export type PresentedProject = {
  id: string;
  name: string;
  description: string;
  organization: { id: string; name: string };
  designStandard: (typeof DESIGN_STANDARDS)[number];
  combinationStandard: (typeof COMBINATION_STANDARDS)[number];
  /** The N in the serviceability deflection limit span/N. */
  deflectionLimit: number;
  createdAt: string;
};

export type ProjectForMember = PresentedProject & { role: Role; abilities: Record<Action, boolean> };

export function projectForMember(project: PresentedProject, role: Role): ProjectForMember {
  return { ...project, role, abilities: abilitiesOf(role) };
}
