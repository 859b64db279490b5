"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";

export function AcceptInvitation({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function accept() {
    setBusy(true);
    setError(null);
    const res = await fetch("/api/v1/invitations/accept", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ token }),
    });
    const body = await res.json().catch(() => null);
    setBusy(false);
    if (res.ok) {
      router.push(`/w/${body.workspace.slug}`);
      router.refresh();
    } else setError(body?.error?.message ?? "That did not work; try again.");
  }
  return (
    <div className="mt-6 space-y-4">
      {error && <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{error}</p>}
      <button type="button" onClick={accept} disabled={busy}
        className="w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {busy ? "Joining…" : "Accept and open the workspace"}
      </button>
    </div>
  );
}
