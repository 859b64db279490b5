import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import { SignInForm } from "./SignInForm";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  return (
    <AuthCard title="Sign in" subtitle="to your Fanbound workspace">
      <SignInForm callbackUrl={safeCallback(callbackUrl)} initialError={errorText(error)} />
    </AuthCard>
  );
}

function errorText(code: string | undefined): string | null {
  if (!code) return null;
  if (code === "RateLimited") return "Too many attempts. Wait a few minutes, then try again.";
  if (code === "BadRequest") return "The sign-in form arrived garbled; reload the page and try again.";
  return "That sign-in did not work; try again.";
}
