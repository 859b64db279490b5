import type { Metadata } from "next";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { requireSignedIn } from "@/lib/identity/session";
import { getMe } from "@/lib/data/users";
import { listTokens } from "@/lib/data/tokens";
import { SignOutButton } from "@/components/ui/SignOutButton";
import { TokenManager } from "./_components/TokenManager";
import { EndSessions } from "./_components/EndSessions";

export const metadata: Metadata = { title: "Account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  const actor = await requireSignedIn("/account");
  const [me, tokens] = await Promise.all([getMe({ actor }), listTokens({ actor })]);
  return (
    <>
      <SiteHeader>
        <span className="text-graphite">{me.user.email}</span>
        <SignOutButton />
      </SiteHeader>
      <main className="page-frame py-10 [&>*]:max-w-5xl">
        <h1 className="text-2xl font-semibold">Account</h1>
        <p className="mt-1 text-graphite">
          {me.user.name} · {me.user.email}{" "}
          {me.user.emailConfirmed ? (
            <span className="text-accent">(confirmed)</span>
          ) : (
            <span className="text-amber">(not confirmed yet: follow the link we mailed you, or sign in once with a link by e-mail)</span>
          )}
        </p>
        <section className="mt-8">
          <h2 className="mb-3 text-sm font-semibold uppercase tracking-wide text-graphite">Sessions</h2>
          <EndSessions />
        </section>
        <section className="mt-8">
          <h2 className="text-sm font-semibold uppercase tracking-wide text-graphite">Personal API tokens</h2>
          <p className="mb-4 mt-1 max-w-2xl text-sm text-graphite">
            For scripts and continuous integration. A token acts as you in every workspace you belong to, until it
            expires or you revoke it. The API is described at <a href="/api/v1/openapi.json" className="font-mono text-accent hover:underline">/api/v1/openapi.json</a>.
          </p>
          <TokenManager initial={tokens} />
        </section>
      </main>
    </>
  );
}
