"use client";
import { signOut } from "next-auth/react";

/** Ends the session and returns to the front page. */
export function SignOutButton({ className }: { className?: string }) {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: "/" })}
      className={className ?? "rounded border border-rule px-3 py-1 text-graphite hover:border-ink hover:text-ink"}>
      Sign out
    </button>
  );
}
