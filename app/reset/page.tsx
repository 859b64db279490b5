import type { Metadata } from "next";
import { AuthCard } from "@/app/signin/AuthCard";
import { ResetForms } from "./ResetForms";

export const metadata: Metadata = { title: "Reset your password" };

export default async function ResetPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  return (
    <AuthCard title={token ? "Choose a new password" : "Reset your password"} subtitle={token ? undefined : "We mail you a link that works once."}>
      <ResetForms token={token ?? null} />
    </AuthCard>
  );
}
