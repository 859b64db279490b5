import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard } from "@/app/signin/AuthCard";
import { currentActor } from "@/lib/identity/session";
import { getMe } from "@/lib/data/users";
import { AcceptInvitation } from "./AcceptInvitation";

export const metadata: Metadata = { title: "Join a workspace" };
export const dynamic = "force-dynamic";

export default async function InvitePage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  if (!token) {
    return (
      <AuthCard title="Join a workspace">
        <p className="mt-6 text-sm text-vermilion">This address has no invitation token; open the link from the e-mail again.</p>
      </AuthCard>
    );
  }
  const here = `/invite?token=${encodeURIComponent(token)}`;
  const actor = await currentActor();
  if (!actor) {
    return (
      <AuthCard title="Join a workspace" subtitle="Sign in, or create an account, with the address the invitation went to.">
        <div className="mt-6 flex gap-3">
          <Link href={`/signin?callbackUrl=${encodeURIComponent(here)}`} className="flex-1 rounded bg-accent px-4 py-2 text-center font-semibold text-paper hover:opacity-90">Sign in</Link>
          <Link href={`/signup?callbackUrl=${encodeURIComponent(here)}`} className="flex-1 rounded border border-rule bg-paper px-4 py-2 text-center hover:border-ink">Create account</Link>
        </div>
      </AuthCard>
    );
  }
  const me = await getMe({ actor });
  return (
    <AuthCard title="Join a workspace" subtitle={`Signed in as ${me.user.email}.`}>
      {!me.user.emailConfirmed && (
        <p role="status" className="mt-6 rounded border border-amber/60 bg-amber/10 px-3 py-2 text-sm text-ink">
          Confirm that {me.user.email} is yours first: open the link in the mail we sent it when you signed up, or sign
          out and sign in with &ldquo;Link by e-mail&rdquo; to it. Then open this invitation again.
        </p>
      )}
      <AcceptInvitation token={token} />
    </AuthCard>
  );
}
