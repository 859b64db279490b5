import type { Role } from "@/lib/client/types";

const text: Record<Role, string> = {
  owner: "owner",
  designer: "designer",
  reviewer: "reviewer",
  viewer: "viewer · read only",
};

export function RoleBadge({ role }: { role: Role }) {
  return (
    <span className="rounded-full border border-rule px-2 py-0.5 text-xs text-graphite" data-role={role}>
      {text[role]}
    </span>
  );
}
