import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import { LinkSignIn } from "./LinkSignIn";

export const metadata: Metadata = { title: "Sign in with your link" };

export default async function LinkPage({ searchParams }: { searchParams: Promise<{ token?: string; callbackUrl?: string }> }) {
  const { token, callbackUrl } = await searchParams;
  return (
    <AuthCard title="Sign in with your link" subtitle="The link from your e-mail works once.">
      {token ? (
        <LinkSignIn token={token} callbackUrl={safeCallback(callbackUrl)} />
      ) : (
        <p className="mt-6 text-sm text-vermilion">This address has no sign-in token; open the link from the e-mail again.</p>
      )}
    </AuthCard>
  );
}
