import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import Link from "next/link";
import { SignInForm } from "./SignInForm";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  return (
    <AuthCard title="Sign in" subtitle="to your Fanbound workspace">
      <SignInForm callbackUrl={safeCallback(callbackUrl)} initialError={errorText(error)} />
      {process.env.FANBOUND_MAIL_CATCHER === "1" && (
        <p className="mt-4 border-t border-rule pt-3 text-xs text-graphite">
          This install keeps its mail on this machine: sign-in links and resets appear under{" "}
          <Link href="/dev/mail" className="text-accent hover:underline">captured mail</Link>.
        </p>
      )}
    </AuthCard>
  );
}

function errorText(code: string | undefined): string | null {
  if (!code) return null;
  if (code === "RateLimited") return "Too many attempts. Wait a minute, then try again.";
  return "That sign-in did not work; try again.";
}
