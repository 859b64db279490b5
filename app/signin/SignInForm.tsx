"use client";
import { useState } from "react";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError: string | null }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(initialError);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    const res = await signIn("password", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    setBusy(false);
    if (res?.ok && !res.error) {
      router.push(callbackUrl);
      router.refresh();
    } else if (res?.status === 429) {
      setError("Too many attempts. Wait a minute, then try again.");
    } else {
      setError("The e-mail or password is not right. Check both and try again.");
    }
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <label className="block text-sm">
        <span className="font-semibold">E-mail</span>
        <input name="email" type="email" autoComplete="email" required
          className="mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent" />
      </label>
      <label className="block text-sm">
        <span className="font-semibold">Password</span>
        <input name="password" type="password" autoComplete="current-password" required
          className="mt-1 block w-full rounded border border-rule bg-paper px-3 py-2 text-ink outline-none focus:border-accent" />
      </label>
      {error && (
        <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">
          {error}
        </p>
      )}
      <button type="submit" disabled={busy}
        className="w-full rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {busy ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
