import "server-only";
/** The caller of a server component or server action, from the next-auth session. */
import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { authOptions } from "./options";
import type { Actor } from "./actor";

/**
 * The signed-in caller, or null. next-auth's jwt callback (lib/identity/options.ts)
 * refuses a session whose version is out of date, so an ended session is null here.
 */
export async function currentActor(): Promise<Actor | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  return id ? { userId: id, via: "session" } : null;
}

/** The signed-in caller; otherwise redirects to sign-in and back to `returnTo` (default "/workspaces"). */
export async function requireSignedIn(returnTo = "/workspaces"): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(returnTo)}`);
  return actor;
}
