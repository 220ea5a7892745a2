import { ROLE_LABELS, type Role } from "@/lib/permissions";

export function RoleBadge({ role }: { role: Role }) {
  return <span className="rounded-full border border-board-200 bg-board-100 px-2 py-0.5 text-xs font-medium text-board-800">{ROLE_LABELS[role]}</span>;
}
