"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import useSWR from "swr";
import type { WorkspaceInfo } from "@/lib/client/types";
import { RoleBadge } from "@/components/ui/RoleBadge";
import { can } from "@/lib/auth/permissions";

// Links on the workspace pages do not prefetch: a dozen route prefetches at load would queue ahead of
// the editor's bundle and the design's data on the browser's few connections to the server.
export function WorkspaceNav({ ws }: { ws: string }) {
  const { data } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: reviews } = useSWR<{ waitingForMe: unknown[] }>(`/api/v1/workspaces/${ws}/reviews`, { refreshInterval: 60_000 });
  const waiting = reviews?.waitingForMe.length ?? 0;
  const path = usePathname();
  const link = (href: string, label: string) => (
    <Link prefetch={false} href={href} className={path === href ? "text-ink" : "hover:text-ink"} aria-current={path === href ? "page" : undefined}>
      {label}
    </Link>
  );
  return (
    <div className="flex items-center gap-4 text-sm text-graphite">
      <span className="font-semibold text-ink">{data?.workspace.name ?? ws}</span>
      {data && <RoleBadge role={data.workspace.role} />}
      {link(`/w/${ws}`, "Designs")}
      {link(`/w/${ws}/families`, "Families")}
      {link(`/w/${ws}/families/matrix`, "Compatibility")}
      {link(`/w/${ws}/reviews`, waiting ? `Reviews (${waiting})` : "Reviews")}
      {link(`/w/${ws}/libraries`, "Libraries")}
      {data && can(data.workspace.role, "member.manage") && link(`/w/${ws}/members`, "Members")}
    </div>
  );
}
