"use client";
import { signOut } from "next-auth/react";

/** Ends the session and returns to the front page. */
export function SignOutButton({ className = "text-graphite hover:text-ink" }: { className?: string }) {
  return (
    <button type="button" onClick={() => signOut({ callbackUrl: "/" })} className={className}>
      Sign out
    </button>
  );
}
