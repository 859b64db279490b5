"use client";
import { useState } from "react";
import Link from "next/link";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";

const input = "mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent";

/** Password sign-in, or a one-time link by e-mail. */
export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError: string | null }) {
  const router = useRouter();
  const [mode, setMode] = useState<"password" | "link">("password");
  const [error, setError] = useState<string | null>(initialError);
  const [notice, setNotice] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const email = String(form.get("email") ?? "");
    setBusy(true);
    setError(null);
    setNotice(null);
    if (mode === "link") {
      const res = await fetch("/api/v1/auth/email-link", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ email, callbackUrl }),
      });
      setBusy(false);
      if (res.ok) setNotice(`If an account uses ${email}, a sign-in link is on its way. It works once, for 15 minutes.`);
      else setError((await res.json().catch(() => null))?.error?.message ?? "That did not work; try again.");
      return;
    }
    const res = await signIn("password", { email, password: String(form.get("password") ?? ""), redirect: false });
    setBusy(false);
    if (res?.ok && !res.error) {
      router.push(callbackUrl);
      router.refresh();
    } else if (res?.status === 429) {
      setError("Too many attempts. Wait a few minutes, then try again.");
    } else {
      setError("The e-mail or password is not right. Check both and try again.");
    }
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <div role="tablist" aria-label="How to sign in" className="flex gap-1 rounded border border-rule bg-paper p-1 text-sm">
        {(["password", "link"] as const).map((m) => (
          <button key={m} type="button" role="tab" aria-selected={mode === m} onClick={() => setMode(m)}
            className={`flex-1 rounded px-2 py-1 ${mode === m ? "bg-sheet font-semibold text-ink shadow-sm" : "text-graphite hover:text-ink"}`}>
            {m === "password" ? "Password" : "Link by e-mail"}
          </button>
        ))}
      </div>
      <label className="block text-sm">
        <span className="font-semibold">E-mail</span>
        <input name="email" type="email" autoComplete="email" required className={input} />
      </label>
      {mode === "password" && (
        <label className="block text-sm">
          <span className="flex justify-between">
            <span className="font-semibold">Password</span>
            <Link href="/reset" className="text-accent hover:underline">Forgotten?</Link>
          </span>
          <input name="password" type="password" autoComplete="current-password" required className={input} />
        </label>
      )}
      {error && (
        <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{error}</p>
      )}
      {notice && (
        <p role="status" className="rounded border border-accent/40 bg-accent/10 px-3 py-2 text-sm text-ink">{notice}</p>
      )}
      <button type="submit" disabled={busy}
        className="w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {mode === "password" ? (busy ? "Signing in…" : "Sign in") : busy ? "Sending…" : "Send me a sign-in link"}
      </button>
      <p className="text-center text-sm text-graphite">
        New here? <Link href={`/signup?callbackUrl=${encodeURIComponent(callbackUrl)}`} className="text-accent hover:underline">Create an account</Link>
      </p>
    </form>
  );
}
