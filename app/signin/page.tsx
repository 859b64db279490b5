import type { Metadata } from "next";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { SignInForm } from "./SignInForm";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  return (
    <>
      <SiteHeader />
      <main className="sheet-grid flex min-h-[calc(100vh-3rem)] items-start justify-center px-4 py-16">
        <div className="w-full max-w-sm rounded border border-rule bg-sheet p-6 shadow-sm">
          <h1 className="text-xl font-semibold">Sign in</h1>
          <p className="mt-1 text-sm text-graphite">to your Fanbound workspace</p>
          <SignInForm callbackUrl={safeCallback(callbackUrl)} initialError={error ? "That sign-in did not work; try again." : null} />
        </div>
      </main>
    </>
  );
}

/** Only paths on this site are followed after sign-in. */
function safeCallback(url: string | undefined): string {
  return url && url.startsWith("/") && !url.startsWith("//") ? url : "/workspaces";
}
