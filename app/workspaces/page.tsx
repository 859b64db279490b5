import { redirect } from "next/navigation";
import { getServerSession } from "next-auth";
import { authOptions } from "@/lib/auth/options";
import { SiteHeader } from "@/components/ui/SiteHeader";

export const dynamic = "force-dynamic";

export default async function Workspaces() {
  const session = await getServerSession(authOptions);
  if (!session?.user) redirect("/signin?callbackUrl=/workspaces");
  return (
    <>
      <SiteHeader>
        <span className="text-graphite">{session.user.email}</span>
      </SiteHeader>
      <main className="mx-auto max-w-6xl px-4 py-10">
        <h1 className="text-2xl font-semibold">Your workspaces</h1>
      </main>
    </>
  );
}
