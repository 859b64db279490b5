"use client";
import { useState } from "react";
import Link from "next/link";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";

const input = "mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent";

export function SignUpForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const body = { name: String(f.get("name") ?? ""), email: String(f.get("email") ?? ""), password: String(f.get("password") ?? ""), callbackUrl };
    setBusy(true);
    setError(null);
    const res = await fetch("/api/v1/auth/signup", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const answer = await res.json().catch(() => null);
    if (!res.ok) {
      setBusy(false);
      setError(answer?.error?.message ?? "That did not work; try again.");
      return;
    }
    // The answer is the same for a new address and a taken one; signing in tells only the owner of the password.
    const signed = await signIn("password", { email: body.email, password: body.password, redirect: false });
    setBusy(false);
    if (signed?.ok && !signed.error) {
      router.push(callbackUrl);
      router.refresh();
    } else setNotice(answer?.message ?? "Check your mail: the message we sent says how to go on.");
  }
  if (notice) {
    return (
      <div className="mt-6 space-y-4 text-sm">
        <p role="status" className="rounded border border-accent/40 bg-accent/10 px-3 py-2 text-ink">{notice}</p>
        <Link href={`/signin?callbackUrl=${encodeURIComponent(callbackUrl)}`} className="block text-center text-accent hover:underline">Go to sign-in</Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <label className="block text-sm"><span className="font-semibold">Name</span>
        <input name="name" autoComplete="name" required maxLength={120} className={input} /></label>
      <label className="block text-sm"><span className="font-semibold">E-mail</span>
        <input name="email" type="email" autoComplete="email" required className={input} />
        <span className="mt-1 block text-xs text-graphite">We mail you a link to confirm it; invitations need a confirmed address.</span></label>
      <label className="block text-sm"><span className="font-semibold">Password</span>
        <input name="password" type="password" autoComplete="new-password" required minLength={10} className={input} />
        <span className="mt-1 block text-xs text-graphite">At least 10 characters, not a common password, a run of keys or your name; three or four unrelated words work well.</span></label>
      {error && <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{error}</p>}
      <button type="submit" disabled={busy} className="w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {busy ? "Creating…" : "Create account"}
      </button>
      <p className="text-center text-sm text-graphite">
        Have an account? <Link href={`/signin?callbackUrl=${encodeURIComponent(callbackUrl)}`} className="text-accent hover:underline">Sign in</Link>
      </p>
    </form>
  );
}
