import "server-only";
/**
 * Who is calling: a personal API token in `Authorization: Bearer`, else the
 * next-auth session cookie. This is the request-identity layer: it sits
 * above the data layer (it looks tokens and sessions up there); the data
 * layer takes the resulting Actor and re-checks membership and role itself.
 */
import { decode } from "next-auth/jwt";
import { resolveApiToken } from "../data/tokens";
import { sessionIsCurrent } from "../data/users";
import { unauthenticated } from "../errors";
import type { Actor } from "../auth/identity";

export type { Actor };

const SESSION_COOKIES = ["__Secure-next-auth.session-token", "next-auth.session-token"];

function cookies(header: string | null): Map<string, string> {
  const out = new Map<string, string>();
  for (const part of (header ?? "").split(";")) {
    const i = part.indexOf("=");
    if (i > 0) out.set(part.slice(0, i).trim(), decodeURIComponent(part.slice(i + 1).trim()));
  }
  return out;
}

/** The session's JWT, joined from next-auth's numbered chunks when it was split. */
function sessionToken(jar: Map<string, string>): string | null {
  for (const name of SESSION_COOKIES) {
    if (jar.has(name)) return jar.get(name)!;
    const parts: string[] = [];
    for (let i = 0; jar.has(`${name}.${i}`); i++) parts.push(jar.get(`${name}.${i}`)!);
    if (parts.length) return parts.join("");
  }
  return null;
}

/**
 * The caller of a request, or null when anonymous. A Bearer header that is not
 * a live token is an error (401), never a fall-back to the cookie. A session
 * cookie counts only while the session version in it is the account's current
 * one (sign-out, a reset or "sign out everywhere" end it).
 */
export async function actorFromRequest(req: Request): Promise<Actor | null> {
  const auth = req.headers.get("authorization");
  if (auth) {
    const m = /^Bearer\s+(\S+)\s*$/i.exec(auth);
    if (!m) throw unauthenticated();
    const userId = await resolveApiToken(m[1]!);
    if (!userId) throw unauthenticated();
    return { userId, via: "token" };
  }
  const raw = sessionToken(cookies(req.headers.get("cookie")));
  const secret = process.env.NEXTAUTH_SECRET;
  if (!raw || !secret) return null;
  let jwt: Awaited<ReturnType<typeof decode>>;
  try {
    jwt = await decode({ token: raw, secret });
  } catch {
    return null;
  }
  if (!jwt?.sub || !(await sessionIsCurrent(jwt.sub, jwt.sv))) return null;
  return { userId: jwt.sub, via: "session" };
}
