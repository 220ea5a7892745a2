// A project as one member sees it: the project plus their role and what the rule book lets that role do.
import type { PresentedProject } from "@/db/queries/projects";
import { abilitiesOf, type Action, type Role } from "@/lib/permissions";

export type ProjectForMember = PresentedProject & { role: Role; abilities: Record<Action, boolean> };

export function projectForMember(project: PresentedProject, role: Role): ProjectForMember {
  return { ...project, role, abilities: abilitiesOf(role) };
}
