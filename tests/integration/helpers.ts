/**
 * Fixtures for the integration tests: real PostgreSQL (DATABASE_URL), real
 * route handlers called in-process with Request objects, Bearer tokens made
 * for each actor. Names carry a random tag so runs and files never collide.
 */
import { randomBytes } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { Op } from "sequelize";
import { db } from "@/lib/db/connection";
import { createToken } from "@/lib/data/tokens";
import { resetLimits } from "@/lib/api/rate-limit";

export { resetLimits };
import { randomSecret, sha256 } from "@/lib/auth/secrets";
import type { Role } from "@/models";

export const BASE = process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3100";
export const tag = () => randomBytes(4).toString("hex");

export const SOURCE = `// Ferrow Lock & Weir: upper gate permit
inputs lower_shut, level_upper, override_key, estop
outputs open_upper
open_upper = estop' * lower_shut * (level_upper + override_key)
`;

export interface TestUser {
  id: string;
  email: string;
  name: string;
  token: string;
}

/**
 * A user without a password (matrix actors sign in by token only), its
 * address confirmed unless `confirmed` is false.
 */
export async function makeUser(label: string, passwordHash: string | null = null, { confirmed = true } = {}): Promise<TestUser> {
  const t = tag();
  const email = `${label}-${t}@test.ferrow.example`;
  const u = await db().models.User.create({ email, name: `${label} ${t}`, passwordHash, emailVerifiedAt: confirmed ? new Date() : null });
  const { secret } = await createToken({ actor: { userId: u.id, via: "token" }, name: "test", expiresAt: new Date(Date.now() + 86_400_000) });
  return { id: u.id, email, name: u.name, token: secret };
}

export async function makeWorkspace(label: string, owner: TestUser) {
  const t = tag();
  const w = await db().models.Workspace.create({ name: `${label} ${t}`, slug: `${label}-${t}`, settings: {} });
  await addMember(w.id, owner, "owner");
  return { id: w.id, slug: w.slug };
}

export async function addMember(workspaceId: string, user: TestUser, role: Role) {
  await db().models.Membership.create({ workspaceId, userId: user.id, role });
}

export async function builtinFamily(key = "cmos-hc-5v") {
  const f = await db().models.LogicFamilyRecord.findOne({ where: { key, workspaceId: { [Op.is]: null } } });
  if (!f) throw new Error(`built-in family ${key} missing: run the seed`);
  return f;
}

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface Call {
  token?: string | null;
  params?: Record<string, string>;
  query?: Record<string, string>;
  body?: unknown;
  rawBody?: string | Uint8Array;
  headers?: Record<string, string>;
}

/** Calls a route handler the way Next does: a Request and a params promise. */
export async function call(handler: Handler, method: string, urlPath: string, c: Call = {}) {
  const url = new URL(`/api/v1${urlPath}`, BASE);
  for (const [k, v] of Object.entries(c.query ?? {})) url.searchParams.set(k, v);
  const headers: Record<string, string> = { ...(c.headers ?? {}) };
  if (c.token) headers.authorization = `Bearer ${c.token}`;
  let body: BodyInit | undefined;
  if (c.rawBody !== undefined) body = c.rawBody as BodyInit;
  else if (c.body !== undefined) {
    body = JSON.stringify(c.body);
    headers["content-type"] ??= "application/json";
  }
  const res = await handler(new Request(url, { method, headers, body }), { params: Promise.resolve(c.params ?? {}) });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = null;
  }
  // Tests read response bodies loosely; the schemas are checked by the handlers and the OpenAPI test.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  return { status: res.status, headers: res.headers, text, json: json as Record<string, any> };
}

/** An invitation row with a known secret (the mail path is tested on its own). */
export async function makeInvitation(workspaceId: string, inviter: TestUser, email: string, role: Role = "viewer") {
  const secret = randomSecret();
  const row = await db().models.Invitation.create({
    workspaceId,
    email,
    role,
    tokenHash: sha256(secret),
    invitedBy: inviter.id,
    expiresAt: new Date(Date.now() + 86_400_000),
    acceptedAt: null,
    revokedAt: null,
  });
  return { id: row.id, secret };
}

/** Where the local mail catcher keeps what it caught (npm test passes it to the tests only; the app never reads it). */
export const MAIL_DIR = process.env.MAIL_DIR ?? ".data/mail-test";
/** The catcher's own read-only page of captured mail. */
export const MAIL_VIEW_URL = process.env.FANBOUND_MAIL_VIEW_URL ?? `http://127.0.0.1:${2626 + Number(process.env.FANBOUND_PORT_OFFSET ?? 0)}/`;

export interface CapturedMail {
  id: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/** Every captured message to `to`, newest first. */
export function mailsTo(to: string): CapturedMail[] {
  const out: CapturedMail[] = [];
  for (const f of readdirSync(MAIL_DIR).filter((n) => n.endsWith(".json")).sort().reverse()) {
    try {
      const m = JSON.parse(readFileSync(path.join(MAIL_DIR, f), "utf8")) as CapturedMail;
      if (m.to.includes(to)) out.push(m);
    } catch {
      // being written
    }
  }
  return out;
}

/** The newest captured message to `to` (whose subject matches, if given), waiting up to ~10 s for the catcher to write it. */
export async function mailTo(to: string, subject?: RegExp): Promise<CapturedMail> {
  for (let i = 0; i < 100; i++) {
    const m = mailsTo(to).find((x) => !subject || subject.test(x.subject));
    if (m) return m;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to}${subject ? ` about ${subject}` : ""} in ${MAIL_DIR}`);
}

/** The first link in a message's text that starts with the site's address. */
export function linkIn(text: string): URL {
  const m = new RegExp(`${BASE.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}/\\S+`).exec(text);
  if (!m) throw new Error(`no link to ${BASE} in: ${text}`);
  return new URL(m[0]);
}

/** Row counts of the tables a bad request might touch. */
export async function counts() {
  const { models } = db();
  const out: Record<string, number> = {};
  for (const name of ["User", "Workspace", "Membership", "LogicFamilyRecord", "Design", "Revision", "Invitation", "ApiToken", "EmailToken"] as const) {
    out[name] = await (models[name] as unknown as { count(): Promise<number> }).count();
  }
  return out;
}
