import { getServerSession } from "next-auth";
import Link from "next/link";
import { authOptions } from "@/lib/auth/options";
import { requireSignedIn } from "@/lib/auth/session";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { SignOutButton } from "@/components/ui/SignOutButton";
import { Providers } from "@/components/ui/Providers";
import { WorkspaceNav } from "@/components/workspace/WorkspaceNav";

export const dynamic = "force-dynamic";

export default async function WorkspaceLayout({ children, params }: { children: React.ReactNode; params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  await requireSignedIn(`/w/${encodeURIComponent(ws)}`);
  const session = await getServerSession(authOptions);
  return (
    <Providers>
      <SiteHeader>
        <Link href="/account" className="text-graphite hover:text-ink">
          {session?.user?.email}
        </Link>
        <SignOutButton />
      </SiteHeader>
      <div className="border-b border-rule bg-paper">
        <div className="mx-auto flex h-10 max-w-[100rem] items-center px-4">
          <WorkspaceNav ws={ws} />
        </div>
      </div>
      {children}
    </Providers>
  );
}
