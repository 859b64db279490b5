import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { getServerSession } from "next-auth";
import { authOptions } from "@/lib/identity/options";
import { requireSignedIn } from "@/lib/identity/session";
import { listWorkspaces } from "@/lib/data/workspaces";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { SignOutButton } from "@/components/ui/SignOutButton";
import { RoleBadge } from "@/components/ui/RoleBadge";

export const metadata: Metadata = { title: "Workspaces" };
export const dynamic = "force-dynamic";

/** Where sign-in lands: straight into the only workspace, or a choice among several. */
export default async function Workspaces() {
  const actor = await requireSignedIn("/workspaces");
  const session = await getServerSession(authOptions);
  const workspaces = await listWorkspaces({ actor });
  if (workspaces.length === 1) redirect(`/w/${workspaces[0]!.slug}`);
  return (
    <>
      <SiteHeader>
        <span className="text-graphite">{session?.user?.email}</span>
        <SignOutButton />
      </SiteHeader>
      <main className="page-frame py-10 [&>*]:max-w-3xl">
        <h1 className="mb-4 text-2xl font-semibold">Your workspaces</h1>
        {workspaces.length === 0 ? (
          <p className="text-graphite">You are not a member of any workspace yet. Ask an owner for an invitation.</p>
        ) : (
          <ul className="divide-y divide-rule rounded border border-rule bg-sheet">
            {workspaces.map((w) => (
              <li key={w.id} className="flex items-center gap-3 px-4 py-3">
                <Link href={`/w/${w.slug}`} className="font-semibold hover:text-accent">{w.name}</Link>
                <RoleBadge role={w.role} />
              </li>
            ))}
          </ul>
        )}
      </main>
    </>
  );
}
