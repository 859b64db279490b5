import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import { SignInForm } from "./SignInForm";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  return (
    <AuthCard title="Sign in" subtitle="to your Fanbound workspace">
      <SignInForm callbackUrl={safeCallback(callbackUrl)} initialError={error ? "That sign-in did not work; try again." : null} />
    </AuthCard>
  );
}
