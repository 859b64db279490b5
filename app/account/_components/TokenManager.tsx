"use client";
import { useState } from "react";

// The row shape the tokens API answers with (a type only: nothing server-side reaches the browser).
import type { TokenSummary as TokenRow } from "@/lib/data/tokens";

export type { TokenRow };

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");
const input = "mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent";

function status(t: TokenRow): { text: string; cls: string } {
  if (t.revokedAt) return { text: "revoked", cls: "text-vermilion" };
  if (new Date(t.expiresAt) <= new Date()) return { text: "expired", cls: "text-amber" };
  return { text: "live", cls: "text-accent" };
}

/** Create (the secret is shown once), list and revoke personal API tokens. */
export function TokenManager({ initial }: { initial: TokenRow[] }) {
  const [tokens, setTokens] = useState(initial);
  const [secret, setSecret] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function create(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const f = new FormData(formEl);
    const days = Number(f.get("days"));
    setBusy(true);
    setError(null);
    const res = await fetch("/api/v1/tokens", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ name: String(f.get("name") ?? ""), expiresAt: new Date(Date.now() + days * 86_400_000).toISOString() }),
    });
    const body = await res.json().catch(() => null);
    setBusy(false);
    if (!res.ok) return setError(body?.error?.message ?? "That did not work; try again.");
    setSecret(body.secret);
    setTokens((t) => [body.token, ...t]);
    formEl.reset();
  }

  async function revoke(id: string) {
    const res = await fetch(`/api/v1/tokens/${id}`, { method: "DELETE" });
    const body = await res.json().catch(() => null);
    if (!res.ok) return setError(body?.error?.message ?? "That did not work; try again.");
    setTokens((t) => t.map((x) => (x.id === id ? body.token : x)));
  }

  return (
    <div className="space-y-6">
      <form onSubmit={create} className="grid gap-3 rounded border border-rule bg-sheet p-4 sm:grid-cols-[1fr_10rem_auto] sm:items-end">
        <label className="block text-sm"><span className="font-semibold">Name</span>
          <input name="name" required maxLength={80} placeholder="nightly check" className={input} /></label>
        <label className="block text-sm"><span className="font-semibold">Expires after</span>
          <select name="days" defaultValue="90" className={input}>
            <option value="7">7 days</option><option value="30">30 days</option><option value="90">90 days</option><option value="365">365 days</option>
          </select></label>
        <button type="submit" disabled={busy} className="rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">Create token</button>
      </form>
      {secret && (
        <div role="status" className="rounded border border-amber/60 bg-amber/10 p-4 text-sm">
          <p className="font-semibold">Copy the token now: it is shown this once and cannot be read again.</p>
          <code className="mt-2 block select-all break-all rounded bg-paper px-2 py-1 font-mono">{secret}</code>
          <p className="mt-2 text-graphite">Send it as <code className="font-mono">Authorization: Bearer …</code> to /api/v1.</p>
          <button type="button" onClick={() => setSecret(null)} className="mt-2 text-accent hover:underline">I have copied it</button>
        </div>
      )}
      {error && <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{error}</p>}
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left text-graphite">
            <th className="py-2 pr-3 font-semibold">Name</th><th className="py-2 pr-3 font-semibold">Starts with</th>
            <th className="py-2 pr-3 font-semibold">Created</th><th className="py-2 pr-3 font-semibold">Expires</th>
            <th className="py-2 pr-3 font-semibold">Last used</th><th className="py-2 pr-3 font-semibold">State</th><th />
          </tr>
        </thead>
        <tbody>
          {tokens.length === 0 && (
            <tr><td colSpan={7} className="py-4 text-graphite">No tokens yet.</td></tr>
          )}
          {tokens.map((t) => {
            const s = status(t);
            return (
              <tr key={t.id} className="border-b border-rule">
                <td className="py-2 pr-3">{t.name}</td>
                <td className="py-2 pr-3 font-mono">{t.prefix}…</td>
                <td className="py-2 pr-3 font-mono">{day(t.createdAt)}</td>
                <td className="py-2 pr-3 font-mono">{day(t.expiresAt)}</td>
                <td className="py-2 pr-3 font-mono">{day(t.lastUsedAt)}</td>
                <td className={`py-2 pr-3 ${s.cls}`}>{s.text}</td>
                <td className="py-2 text-right">
                  {s.text === "live" && (
                    <button type="button" onClick={() => revoke(t.id)} className="text-vermilion hover:underline">Revoke</button>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
