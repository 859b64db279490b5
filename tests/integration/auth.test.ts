/**
 * Sign-in by e-mail link, password reset, sign-up, address confirmation and
 * invitations, end to end through the local mail catcher: the test reads the
 * captured message from the catcher's files (MAIL_DIR), takes the link out of
 * it and completes it the way the page does. Mail goes out after the answer
 * (lib/api/after.ts), so the tests wait for that work with `settled()`.
 */
import http from "node:http";
import { beforeEach, describe, expect, it } from "vitest";
import { encode } from "next-auth/jwt";
import { db } from "@/lib/db/connection";
import { hashPassword } from "@/lib/auth/password";
import { authOptions, authorizeEmailLink, authorizePassword } from "@/lib/identity/options";
import { holdTasks, settled } from "@/lib/api/after";
import { randomSecret, sha256 } from "@/lib/auth/secrets";
import * as emailLink from "@/app/api/v1/auth/email-link/route";
import * as reset from "@/app/api/v1/auth/password-reset/route";
import * as resetComplete from "@/app/api/v1/auth/password-reset/complete/route";
import * as signup from "@/app/api/v1/auth/signup/route";
import * as verify from "@/app/api/v1/auth/verify-email/route";
import * as endSessions from "@/app/api/v1/me/sessions/end/route";
import * as invitations from "@/app/api/v1/workspaces/[ws]/invitations/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as me from "@/app/api/v1/me/route";
import * as tokensRoute from "@/app/api/v1/tokens/route";
import { BASE, MAIL_VIEW_URL, call, linkIn, mailTo, mailsTo, makeUser, makeWorkspace, resetLimits, tag } from "./helpers";

beforeEach(async () => {
  await resetLimits();
});

/** A session cookie as next-auth would set it after signing `userId` in at session version `sv`. */
async function sessionCookie(userId: string, sv: number) {
  const jwt = await encode({ token: { sub: userId, sv }, secret: process.env.NEXTAUTH_SECRET! });
  return `next-auth.session-token=${jwt}`;
}

/** Counts the SQL statements sent while `fn` runs (Sequelize's per-query logging hook). */
async function countQueries<T>(fn: () => Promise<T>): Promise<{ result: T; queries: string[] }> {
  const queries: string[] = [];
  const options = (db().sequelize as unknown as { options: { logging: unknown } }).options;
  const saved = options.logging;
  options.logging = (sql: string) => queries.push(sql);
  try {
    return { result: await fn(), queries };
  } finally {
    options.logging = saved;
  }
}

describe("sign-in by e-mail link", () => {
  it("mails a link whose token signs the user in once and confirms the address", async () => {
    const u = await makeUser("linker", null, { confirmed: false });
    const r = await call(emailLink.POST, "POST", "/auth/email-link", { body: { email: u.email.toUpperCase() } });
    expect(r.status).toBe(202);
    await settled();
    const mail = await mailTo(u.email);
    expect(mail.subject).toMatch(/sign-in link/i);
    const link = linkIn(mail.text);
    expect(link.origin).toBe(new URL(BASE).origin);
    expect(link.pathname).toBe("/signin/link");
    expect(mail.html).toContain(`href="${link.toString().replace(/&/g, "&amp;")}"`);
    const token = link.searchParams.get("token")!;
    const signedIn = await authorizeEmailLink({ token });
    expect(signedIn).toMatchObject({ id: u.id, email: u.email, sessionVersion: 0 });
    expect(await authorizeEmailLink({ token })).toBeNull(); // single use
    expect((await db().models.User.findByPk(u.id))!.emailVerifiedAt).not.toBeNull();
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const email = `nobody-${tag()}@test.ferrow.example`;
    const r = await call(emailLink.POST, "POST", "/auth/email-link", { body: { email } });
    expect(r.status).toBe(202);
    await settled();
    expect(await db().models.EmailToken.count({ where: { email } })).toBe(0);
    expect(mailsTo(email)).toEqual([]);
  });

  it("refuses an expired link", async () => {
    const u = await makeUser("late");
    const secret = randomSecret();
    await db().models.EmailToken.create({ purpose: "signin", email: u.email, tokenHash: sha256(secret), expiresAt: new Date(Date.now() - 1000), usedAt: null });
    expect(await authorizeEmailLink({ token: secret })).toBeNull();
  });
});

describe("known and unknown addresses get the same answer after the same work", () => {
  // What is done, not how long it takes: the request sends the same statements
  // to the database and leaves the same amount of work for after the answer.
  for (const [name, handler, path] of [
    ["sign-in link", emailLink.POST, "/auth/email-link"],
    ["password reset", reset.POST, "/auth/password-reset"],
  ] as const) {
    it(`${name}: no look-up before answering, one task after it, mail only to the account`, async () => {
      const known = await makeUser("known");
      const unknown = `unknown-${tag()}@test.ferrow.example`;
      const held = holdTasks();
      const a = await countQueries(() => call(handler, "POST", path, { body: { email: known.email } }));
      const b = await countQueries(() => call(handler, "POST", path, { body: { email: unknown } }));
      expect(held.tasks).toHaveLength(2);
      await held.release();
      expect([a.result.status, b.result.status]).toEqual([202, 202]);
      expect(a.result.text).toBe(b.result.text);
      // No look-up before the answer (the rate-limit counters, alike for both, go through the limiter's own statements).
      expect(a.queries).toEqual([]);
      expect(b.queries).toEqual([]);
      expect((await mailTo(known.email)).subject).toMatch(name === "password reset" ? /reset/i : /sign-in/i);
      expect(mailsTo(unknown)).toEqual([]);
    });
  }

  it("sign-up: a taken address answers like a new one after the same statements; its owner gets a note", async () => {
    const existing = await makeUser("taken", await hashPassword("original-weir-password"));
    const fresh = `fresh-${tag()}@test.ferrow.example`;
    const held = holdTasks();
    const a = await countQueries(() =>
      call(signup.POST, "POST", "/auth/signup", { body: { email: existing.email.toUpperCase(), name: "Someone Else", password: "paddle-and-gate" } }));
    const b = await countQueries(() =>
      call(signup.POST, "POST", "/auth/signup", { body: { email: fresh, name: "Nia Lockwood", password: "paddle-and-gate" } }));
    expect(held.tasks).toHaveLength(2);
    await held.release();
    expect([a.result.status, b.result.status]).toEqual([202, 202]);
    expect(a.result.json.message.replace(existing.email, "X")).toBe(b.result.json.message.replace(fresh, "X"));
    expect(a.queries.map(shape)).toEqual(b.queries.map(shape));
    // The existing account is untouched; its owner is told, and nothing is issued.
    expect(await authorizePassword({ email: existing.email, password: "original-weir-password" })).toMatchObject({ id: existing.id });
    expect(await authorizePassword({ email: existing.email, password: "paddle-and-gate" })).toBeNull();
    expect((await mailTo(existing.email)).subject).toMatch(/tried to create/i);
    expect(await db().models.EmailToken.count({ where: { email: existing.email, purpose: "verify" } })).toBe(0);
    // The new one can sign in, and has a confirmation link on its way.
    expect(await authorizePassword({ email: fresh, password: "paddle-and-gate" })).toMatchObject({ email: fresh });
    expect((await mailTo(fresh)).subject).toMatch(/confirm your address/i);
  });
});

/** A SQL statement with its values blanked, so two requests for different addresses compare. */
function shape(sql: string): string {
  return sql.replace(/'[^']*'/g, "?").replace(/\$\d+/g, "?");
}

describe("password reset by e-mail", () => {
  it("sets a new password once; the old one stops working, and so does every session", async () => {
    const u = await makeUser("forgetful", await hashPassword("old-sluice-password"));
    expect(await authorizePassword({ email: u.email, password: "old-sluice-password" })).toMatchObject({ id: u.id });
    const cookie = await sessionCookie(u.id, 0);
    expect((await call(me.GET, "GET", "/me", { headers: { cookie } })).status).toBe(200);
    const r = await call(reset.POST, "POST", "/auth/password-reset", { body: { email: u.email } });
    expect(r.status).toBe(202);
    await settled();
    const link = linkIn((await mailTo(u.email, /reset/i)).text);
    expect(link.pathname).toBe("/reset");
    const token = link.searchParams.get("token")!;
    const short = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "short" } });
    expect(short.status).toBe(400);
    const common = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "password123" } });
    expect(common.status).toBe(400);
    expect(common.json.error.details[0]).toMatchObject({ path: "password" });
    const done = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "new-sluice-password" } });
    expect(done.status).toBe(200);
    expect(done.json).toEqual({ ok: true, tokensRevoked: 0 });
    expect(await authorizePassword({ email: u.email, password: "new-sluice-password" })).toMatchObject({ id: u.id, sessionVersion: 1 });
    expect(await authorizePassword({ email: u.email, password: "old-sluice-password" })).toBeNull();
    const again = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "third-sluice-password" } });
    expect(again.status).toBe(400);
    expect(await authorizePassword({ email: u.email, password: "third-sluice-password" })).toBeNull();
    // The session from before the reset has ended; API tokens were kept (not asked to revoke them).
    expect((await call(me.GET, "GET", "/me", { headers: { cookie } })).status).toBe(401);
    expect((await call(me.GET, "GET", "/me", { token: u.token })).status).toBe(200);
  });

  it("revokes the account's API tokens too when asked", async () => {
    const u = await makeUser("leaked", await hashPassword("old-culvert-password"));
    const second = await call(tokensRoute.POST, "POST", "/tokens", {
      token: u.token, body: { name: "ci", expiresAt: new Date(Date.now() + 86_400_000).toISOString() },
    });
    await call(reset.POST, "POST", "/auth/password-reset", { body: { email: u.email } });
    await settled();
    const token = linkIn((await mailTo(u.email, /reset/i)).text).searchParams.get("token")!;
    const done = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", {
      body: { token, password: "new-culvert-password", revokeApiTokens: true },
    });
    expect(done.json).toEqual({ ok: true, tokensRevoked: 2 });
    expect((await call(me.GET, "GET", "/me", { token: u.token })).status).toBe(401);
    expect((await call(me.GET, "GET", "/me", { token: second.json.secret })).status).toBe(401);
  });
});

describe("sessions end", () => {
  it("sign out everywhere: the cookie of every session stops working", async () => {
    const u = await makeUser("everywhere");
    const a = await sessionCookie(u.id, 0);
    const b = await sessionCookie(u.id, 0);
    expect((await call(me.GET, "GET", "/me", { headers: { cookie: a } })).status).toBe(200);
    // A cross-site form cannot send it: the body must be JSON.
    const form = await call(endSessions.POST, "POST", "/me/sessions/end", { headers: { cookie: a, "content-type": "application/x-www-form-urlencoded" }, rawBody: "" });
    expect(form.status).toBe(415);
    const ended = await call(endSessions.POST, "POST", "/me/sessions/end", { headers: { cookie: a }, body: {} });
    expect(ended.status).toBe(200);
    for (const cookie of [a, b]) expect((await call(me.GET, "GET", "/me", { headers: { cookie } })).status).toBe(401);
  });

  it("sign-out ends the session for good: next-auth's signOut event raises the version, and a stale JWT is refused by the jwt callback", async () => {
    const u = await makeUser("leaver");
    const cookie = await sessionCookie(u.id, 0);
    await authOptions.events!.signOut!({ token: { sub: u.id, sv: 0 }, session: undefined as never });
    expect((await call(me.GET, "GET", "/me", { headers: { cookie } })).status).toBe(401);
    const jwt = authOptions.callbacks!.jwt!;
    await expect(jwt({ token: { sub: u.id, sv: 0 }, user: undefined as never, account: null })).rejects.toThrow(/ended/);
    await expect(jwt({ token: { sub: u.id, sv: 1 }, user: undefined as never, account: null })).resolves.toMatchObject({ sub: u.id });
    // A signed-out token raising the version again would end newer sessions; it does not.
    await authOptions.events!.signOut!({ token: { sub: u.id, sv: 0 }, session: undefined as never });
    expect((await db().models.User.findByPk(u.id))!.sessionVersion).toBe(1);
  });
});

describe("sign-up", () => {
  it("creates an account and mails a link that confirms the address", async () => {
    const email = `new-${tag()}@test.ferrow.example`;
    const r = await call(signup.POST, "POST", "/auth/signup", { body: { email, name: "Nia Lockwood", password: "paddle-and-gate", callbackUrl: "/invite?token=abc" } });
    expect(r.status).toBe(202);
    expect(r.json).toMatchObject({ ok: true, message: expect.stringContaining(email) });
    const user = (await db().models.User.findOne({ where: { email } }))!;
    expect(await authorizePassword({ email, password: "paddle-and-gate" })).toMatchObject({ id: user.id });
    expect(user.passwordHash).toMatch(/^\$2[aby]\$12\$/); // bcrypt modular crypt format, cost 12
    expect(user.emailVerifiedAt).toBeNull();
    await settled();
    const link = linkIn((await mailTo(email, /confirm/i)).text);
    expect(link.pathname).toBe("/verify");
    expect(link.searchParams.get("callbackUrl")).toBe("/invite?token=abc");
    const ok = await call(verify.POST, "POST", "/auth/verify-email", { body: { token: link.searchParams.get("token") } });
    expect(ok.status).toBe(200);
    expect(ok.json).toEqual({ ok: true, email });
    expect((await db().models.User.findByPk(user.id))!.emailVerifiedAt).not.toBeNull();
    const twice = await call(verify.POST, "POST", "/auth/verify-email", { body: { token: link.searchParams.get("token") } });
    expect(twice.status).toBe(400);
  });

  it("refuses common, repeated and personal passwords, saying what to change", async () => {
    const email = `picky-${tag()}@test.ferrow.example`;
    const cases: Array<[string, RegExp]> = [
      ["aaaaaaaaaa", /repeats/],
      ["1234567890", /passwords people use most|run of characters/],
      ["password123", /passwords people use most/],
      ["qwertyuiop", /passwords people use most|keys/],
      ["asdfghjkl;", /neighbouring keys/],
      [email, /e-mail address or name/],
      ["Marlow Brack 1", /e-mail address or name/],
    ];
    for (const [password, why] of cases) {
      const r = await call(signup.POST, "POST", "/auth/signup", { body: { email, name: "Marlow Brack", password } });
      expect(r.status, password).toBe(400);
      expect(r.json.error.message, password).toMatch(why);
      expect(r.json.error.message, password).toMatch(/unrelated words/);
      expect(r.json.error.details[0]).toMatchObject({ path: "password" });
    }
    expect(await db().models.User.count({ where: { email } })).toBe(0);
  });
});

describe("invitations by e-mail", () => {
  it("the invited address accepts once through the mailed link; others cannot", async () => {
    const owner = await makeUser("host");
    const ws = await makeWorkspace("invites", owner);
    const invitee = await makeUser("invitee");
    const stranger = await makeUser("stranger");
    const r = await call(invitations.POST, "POST", "/i", { token: owner.token, params: { ws: ws.slug }, body: { email: invitee.email, role: "designer" } });
    expect(r.status).toBe(201);
    const link = linkIn((await mailTo(invitee.email)).text);
    expect(link.pathname).toBe("/invite");
    const token = link.searchParams.get("token")!;
    const wrong = await call(accept.POST, "POST", "/invitations/accept", { token: stranger.token, body: { token } });
    expect(wrong.status).toBe(403);
    const ok = await call(accept.POST, "POST", "/invitations/accept", { token: invitee.token, body: { token } });
    expect(ok.status).toBe(200);
    expect(ok.json.workspace).toMatchObject({ slug: ws.slug, role: "designer" });
    const mine = await call(me.GET, "GET", "/me", { token: invitee.token });
    expect(mine.json.workspaces).toEqual([expect.objectContaining({ slug: ws.slug, role: "designer" })]);
    const twice = await call(accept.POST, "POST", "/invitations/accept", { token: invitee.token, body: { token } });
    expect(twice.status).toBe(409);
    const dupInvite = await call(invitations.POST, "POST", "/i", { token: owner.token, params: { ws: ws.slug }, body: { email: invitee.email, role: "viewer" } });
    expect(dupInvite.status).toBe(409);
  });

  it("an address nobody has confirmed cannot accept (403 saying how to confirm it); after a sign-in link to it, it can", async () => {
    const owner = await makeUser("host");
    const ws = await makeWorkspace("owners", owner);
    // Someone signs up with an address that is not theirs, then finds an owner invitation to it.
    const email = `claimed-${tag()}@test.ferrow.example`;
    await call(signup.POST, "POST", "/auth/signup", { body: { email, name: "Impostor", password: "paddle-and-gate" } });
    const squatter = (await db().models.User.findOne({ where: { email } }))!;
    const cookie = await sessionCookie(squatter.id, 0);
    await call(invitations.POST, "POST", "/i", { token: owner.token, params: { ws: ws.slug }, body: { email, role: "owner" } });
    const token = linkIn((await mailTo(email, /invites you/)).text).searchParams.get("token")!;
    const refused = await call(accept.POST, "POST", "/invitations/accept", { headers: { cookie }, body: { token } });
    expect(refused.status).toBe(403);
    expect(refused.json.error.message).toMatch(/Confirm that .* is your address/);
    expect(refused.json.error.message).toMatch(/Link by e-mail/);
    expect(refused.json.error.details).toMatchObject({ reason: "email_unconfirmed" });
    expect(await db().models.Membership.count({ where: { workspaceId: ws.id, userId: squatter.id } })).toBe(0);
    // Only the owner of the mailbox can follow a link sent to it.
    await call(emailLink.POST, "POST", "/auth/email-link", { body: { email } });
    await settled();
    const signIn = linkIn((await mailTo(email, /sign-in link/)).text).searchParams.get("token")!;
    expect(await authorizeEmailLink({ token: signIn })).toMatchObject({ id: squatter.id });
    const ok = await call(accept.POST, "POST", "/invitations/accept", { headers: { cookie }, body: { token } });
    expect(ok.status).toBe(200);
  });
});

describe("the mail catcher's own page", () => {
  /** A GET to the catcher with a chosen Host header (fetch will not send another host's name). */
  function get(pathname: string, host?: string, method = "GET"): Promise<{ status: number; body: string; headers: http.IncomingHttpHeaders }> {
    const u = new URL(pathname, MAIL_VIEW_URL);
    return new Promise((resolve, reject) => {
      const req = http.request({ host: u.hostname, port: u.port, path: u.pathname, method, headers: host ? { host } : {} }, (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode!, body, headers: res.headers }));
      });
      req.on("error", reject);
      req.end();
    });
  }

  it("lists the captured mail and shows a message, read-only and on loopback only", async () => {
    const u = await makeUser("reader");
    await call(reset.POST, "POST", "/auth/password-reset", { body: { email: u.email } });
    await settled();
    const mail = await mailTo(u.email);
    const list = await get("/");
    expect(list.status).toBe(200);
    expect(list.headers["content-security-policy"]).toContain("default-src 'none'");
    expect(list.body).toContain(u.email);
    expect(list.body).toContain(`/m/${mail.id}`);
    const one = await get(`/m/${mail.id}`);
    expect(one.status).toBe(200);
    expect(one.body).toContain("Reset your Fanbound password");
    expect(one.body).toContain(`href="${linkIn(mail.text).toString().replace(/&/g, "&amp;")}"`);
    const json = JSON.parse((await get("/messages.json")).body) as Array<{ id: string }>;
    expect(json.map((m) => m.id)).toContain(mail.id);
    expect((await get("/", undefined, "POST")).status).toBe(405);
    expect((await get("/m/..%2F..%2Fetc")).status).toBe(404);
    // A page whose own domain points at 127.0.0.1 (DNS rebinding) is refused.
    expect((await get("/", "mail.attacker.example")).status).toBe(421);
  });
});
