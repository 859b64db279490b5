import "server-only";
import type { NextAuthOptions } from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { z } from "zod";
import { endSessionsFrom, findUserForSignIn, sessionIsCurrent, type SignedInUser } from "../data/users";
import { consumeSignInLink } from "../data/accounts";

const passwordCredentials = z.object({
  email: z.string().trim().toLowerCase().email(),
  password: z.string().min(1).max(200),
});
const linkCredentials = z.object({ token: z.string().min(10).max(200) });

type SignedIn = SignedInUser;

/** Thrown by the jwt callback for a session whose version is out of date; next-auth then clears its cookie. */
class SessionEnded extends Error {
  constructor() {
    super("this session has ended (signed out, password reset or signed out everywhere)");
    this.name = "SessionEnded";
  }
}

/** The "password" provider's check: the user, or null when e-mail or password is wrong. */
export async function authorizePassword(raw: unknown): Promise<SignedIn | null> {
  const parsed = passwordCredentials.safeParse(raw);
  if (!parsed.success) return null;
  return findUserForSignIn(parsed.data.email, parsed.data.password);
}

/** The "email-link" provider's check: uses up a one-time sign-in secret from a mailed link. */
export async function authorizeEmailLink(raw: unknown): Promise<SignedIn | null> {
  const parsed = linkCredentials.safeParse(raw);
  if (!parsed.success) return null;
  return consumeSignInLink(parsed.data.token);
}

/**
 * next-auth 4 with JWT sessions; the user id travels in the token as `sub`,
 * the account's session version at sign-in as `sv`. A session lives while
 * `sv` equals users.session_version: sign-out, a password reset and "sign out
 * everywhere" raise it. lib/identity/actor.ts checks the same for API requests.
 * Rate limits on sign-in sit in the route (app/api/auth/[...nextauth]).
 */
export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 60 * 60 * 24 * 7 },
  pages: { signIn: "/signin" },
  providers: [
    Credentials({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      authorize: (raw) => authorizePassword(raw),
    }),
    // A one-time link by e-mail, as a second Credentials provider: next-auth's
    // Email provider would need a database adapter, which JWT sessions do not use.
    Credentials({
      id: "email-link",
      name: "Sign-in link by e-mail",
      credentials: { token: { label: "Token", type: "text" } },
      authorize: (raw) => authorizeEmailLink(raw),
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.sv = (user as SignedIn).sessionVersion;
        return token;
      }
      if (!token.sub || !(await sessionIsCurrent(token.sub, token.sv))) throw new SessionEnded();
      return token;
    },
    async session({ session, token }) {
      if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
      return session;
    },
  },
  events: {
    // Signing out ends the session for good, not only in this browser: a copy of the cookie stops working too.
    async signOut({ token }) {
      if (token?.sub) await endSessionsFrom(token.sub, token.sv);
    },
  },
  logger: {
    error(code, metadata) {
      // An ended session is expected, not an error of the server.
      if (code === "JWT_SESSION_ERROR" && JSON.stringify(metadata ?? "").includes("SessionEnded")) return;
      console.error(`[next-auth] ${code}`, metadata);
    },
    warn(code) {
      console.warn(`[next-auth] ${code}`);
    },
    debug() {},
  },
};
