"use client";
import { useState } from "react";
import Link from "next/link";

// A click, not page load, spends the link: mail scanners that fetch links must not use it up.
export function ConfirmAddress({ token, callbackUrl }: { token: string; callbackUrl: string }) {
  const [state, setState] = useState<{ kind: "idle" | "busy" } | { kind: "done"; email: string } | { kind: "failed"; message: string }>({ kind: "idle" });
  async function confirm() {
    setState({ kind: "busy" });
    const res = await fetch("/api/v1/auth/verify-email", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ token }),
    });
    const body = await res.json().catch(() => null);
    if (res.ok) setState({ kind: "done", email: body.email });
    else setState({ kind: "failed", message: body?.error?.message ?? "That did not work; try again." });
  }
  if (state.kind === "done") {
    return (
      <div className="mt-6 space-y-4 text-sm">
        <p role="status" className="rounded border border-accent/40 bg-accent/10 px-3 py-2 text-ink">
          {state.email} is confirmed. Invitations sent to it can be accepted now.
        </p>
        <Link href={callbackUrl} className="block text-center text-accent hover:underline">Go on</Link>
      </div>
    );
  }
  if (state.kind === "failed") {
    return (
      <p role="alert" className="mt-6 rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">
        {state.message} <Link href="/signin" className="underline">Sign in</Link>
      </p>
    );
  }
  return (
    <button type="button" onClick={confirm} disabled={state.kind === "busy"}
      className="mt-6 w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
      {state.kind === "busy" ? "Confirming…" : "Confirm my address"}
    </button>
  );
}
