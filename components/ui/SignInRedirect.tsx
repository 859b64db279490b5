"use client";
import { useEffect } from "react";

/**
 * Sends a signed-out visitor to sign-in with the whole address they opened
 * (path, query and fragment), so they come back to that very page — a design
 * link from a mail, say — and not to the workspace's home. A layout cannot
 * see the path below it on the server, so this runs in the browser.
 */
export function SignInRedirect() {
  useEffect(() => {
    const here = window.location.pathname + window.location.search + window.location.hash;
    window.location.replace(`/signin?callbackUrl=${encodeURIComponent(here)}`);
  }, []);
  return <p className="page-frame py-10 text-graphite">Sign in to open this page… (taking you to the sign-in page)</p>;
}
