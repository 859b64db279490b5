import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import { ConfirmAddress } from "./ConfirmAddress";

export const metadata: Metadata = { title: "Confirm your address" };

export default async function VerifyPage({ searchParams }: { searchParams: Promise<{ token?: string; callbackUrl?: string }> }) {
  const { token, callbackUrl } = await searchParams;
  return (
    <AuthCard title="Confirm your address" subtitle="The link from your e-mail works once.">
      {token ? (
        <ConfirmAddress token={token} callbackUrl={safeCallback(callbackUrl)} />
      ) : (
        <p className="mt-6 text-sm text-vermilion">This address has no confirmation token; open the link from the e-mail again.</p>
      )}
    </AuthCard>
  );
}
