"use client";
import { useState } from "react";
import { signOut } from "next-auth/react";

/** Ends every session of the account, this browser's included; API tokens stay. */
export function EndSessions() {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function endAll() {
    setBusy(true);
    setError(null);
    const res = await fetch("/api/v1/me/sessions/end", { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
    if (!res.ok) {
      setBusy(false);
      setError((await res.json().catch(() => null))?.error?.message ?? "That did not work; try again.");
      return;
    }
    // This browser's cookie is dead already; clear it and go to the sign-in page.
    await signOut({ callbackUrl: "/signin" });
  }
  return (
    <div className="rounded border border-rule bg-sheet p-4 text-sm">
      <p className="max-w-2xl text-graphite">
        Signed in on a machine you no longer use, or think someone else has your session? This ends every session of
        your account at once, on every browser and this one. Personal API tokens keep working; revoke them below.
      </p>
      {error && <p role="alert" className="mt-3 rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-vermilion">{error}</p>}
      <button type="button" onClick={endAll} disabled={busy}
        className="mt-3 rounded border border-vermilion/60 px-4 py-2 font-semibold text-vermilion hover:bg-vermilion/10 disabled:opacity-60">
        {busy ? "Signing out…" : "Sign out everywhere"}
      </button>
    </div>
  );
}
