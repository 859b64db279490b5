import { getServerSession } from "next-auth";
import Link from "next/link";
import { authOptions } from "@/lib/identity/options";
import { currentActor } from "@/lib/identity/session";
import { SignInRedirect } from "@/components/ui/SignInRedirect";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { SignOutButton } from "@/components/ui/SignOutButton";
import { Providers } from "@/components/ui/Providers";
import { WorkspaceNav } from "@/components/workspace/WorkspaceNav";

export const dynamic = "force-dynamic";

export default async function WorkspaceLayout({ children, params }: { children: React.ReactNode; params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  // Signed out: nothing of the workspace is rendered; the browser goes to sign-in and back to this exact page.
  if (!(await currentActor())) return <SignInRedirect />;
  const session = await getServerSession(authOptions);
  return (
    <Providers>
      <SiteHeader>
        <Link prefetch={false} href="/account" className="text-graphite hover:text-ink">
          {session?.user?.email}
        </Link>
        <SignOutButton />
      </SiteHeader>
      <div className="border-b border-rule bg-paper">
        <div className="page-frame flex h-10 items-center">
          <WorkspaceNav ws={ws} />
        </div>
      </div>
      {children}
    </Providers>
  );
}
