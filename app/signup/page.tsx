import type { Metadata } from "next";
import { AuthCard, safeCallback } from "@/app/signin/AuthCard";
import { SignUpForm } from "./SignUpForm";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string }> }) {
  const { callbackUrl } = await searchParams;
  return (
    <AuthCard title="Create an account" subtitle="Invited to a workspace? Use the address the invitation went to.">
      <SignUpForm callbackUrl={safeCallback(callbackUrl)} />
    </AuthCard>
  );
}
