"use client";
import { useState } from "react";
import Link from "next/link";

const input = "mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent";

async function post(path: string, body: unknown): Promise<{ error: string | null; answer: Record<string, unknown> | null }> {
  const res = await fetch(path, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  const answer = await res.json().catch(() => null);
  if (res.ok) return { error: null, answer };
  return { error: answer?.error?.message ?? "That did not work; try again.", answer };
}

/** Without a token: ask for a reset mail. With one: choose the new password. */
export function ResetForms({ token }: { token: string | null }) {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    if (token) {
      const password = String(f.get("password") ?? "");
      if (password !== String(f.get("again") ?? "")) {
        setBusy(false);
        setError("The two passwords differ; type the same one twice.");
        return;
      }
      const revokeApiTokens = f.get("revokeApiTokens") === "on";
      const { error: err, answer } = await post("/api/v1/auth/password-reset/complete", { token, password, revokeApiTokens });
      setBusy(false);
      if (err) setError(err);
      else {
        const n = Number(answer?.tokensRevoked ?? 0);
        const tokens = revokeApiTokens ? ` ${n === 1 ? "One API token was" : `${n} API tokens were`} revoked.` : "";
        setDone(`Your password is changed, and every session of the account has ended.${tokens} Sign in with the new password.`);
      }
    } else {
      const email = String(f.get("email") ?? "");
      const { error: err } = await post("/api/v1/auth/password-reset", { email });
      setBusy(false);
      if (err) setError(err);
      else setDone(`If an account uses ${email}, a reset link is on its way. It works once, for 30 minutes.`);
    }
  }
  if (done) {
    return (
      <div className="mt-6 space-y-4 text-sm">
        <p role="status" className="rounded border border-accent/40 bg-accent/10 px-3 py-2 text-ink">{done}</p>
        <Link href="/signin" className="block text-center text-accent hover:underline">Back to sign-in</Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      {token ? (
        <>
          <label className="block text-sm"><span className="font-semibold">New password</span>
            <input name="password" type="password" autoComplete="new-password" minLength={10} required className={input} />
            <span className="mt-1 block text-xs text-graphite">At least 10 characters, not a common password, a run of keys or your name.</span></label>
          <label className="block text-sm"><span className="font-semibold">The same again</span>
            <input name="again" type="password" autoComplete="new-password" required className={input} /></label>
          <label className="flex items-start gap-2 text-sm">
            <input name="revokeApiTokens" type="checkbox" className="mt-1 accent-accent" />
            <span>Also revoke my personal API tokens
              <span className="block text-xs text-graphite">Every session ends in any case. Revoke the tokens too if someone else may have had your password; scripts then need new ones.</span></span>
          </label>
        </>
      ) : (
        <label className="block text-sm"><span className="font-semibold">E-mail</span>
          <input name="email" type="email" autoComplete="email" required className={input} /></label>
      )}
      {error && <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{error}</p>}
      <button type="submit" disabled={busy} className="w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {token ? (busy ? "Saving…" : "Set the new password") : busy ? "Sending…" : "Send me a reset link"}
      </button>
    </form>
  );
}
