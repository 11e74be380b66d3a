import type { Role } from "@/lib/policy";

const TONES: Record<Role, string> = {
  viewer: "bg-line/60 text-ink-soft",
  contributor: "bg-tide-100 text-tide-800",
  curator: "bg-saffron-100 text-saffron-700",
  admin: "bg-tide-800 text-paper-raised",
};

export function RoleBadge({ role }: { role: Role }) {
  return <span className={`inline-flex rounded-full px-2 py-0.5 text-xs font-semibold ${TONES[role]}`}>{role}</span>;
}
