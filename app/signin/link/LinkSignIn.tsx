"use client";
import { useState } from "react";
import Link from "next/link";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";

// A click, not page load, spends the link: mail scanners that fetch links must not use it up.
export function LinkSignIn({ token, callbackUrl }: { token: string; callbackUrl: string }) {
  const router = useRouter();
  const [state, setState] = useState<"idle" | "busy" | "failed">("idle");
  async function go() {
    setState("busy");
    const res = await signIn("email-link", { token, redirect: false });
    if (res?.ok && !res.error) {
      router.push(callbackUrl);
      router.refresh();
    } else setState("failed");
  }
  if (state === "failed") {
    return (
      <p role="alert" className="mt-6 rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">
        This link is used up or has expired. <Link href="/signin" className="underline">Ask for a new one</Link>.
      </p>
    );
  }
  return (
    <button type="button" onClick={go} disabled={state === "busy"}
      className="mt-6 w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
      {state === "busy" ? "Signing in…" : "Sign in to Fanbound"}
    </button>
  );
}
