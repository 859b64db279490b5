/**
 * Sign-in by e-mail link, password reset, sign-up and invitations, end to end
 * through the local mail catcher: the test reads the captured message from
 * MAIL_DIR, takes the link out of it and completes it the way the page does.
 */
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "@/lib/db/connection";
import { hashPassword } from "@/lib/auth/password";
import { authorizeEmailLink, authorizePassword } from "@/lib/auth/options";
import { limiters } from "@/lib/api/rate-limit";
import { randomSecret, sha256 } from "@/lib/auth/secrets";
import * as emailLink from "@/app/api/v1/auth/email-link/route";
import * as reset from "@/app/api/v1/auth/password-reset/route";
import * as resetComplete from "@/app/api/v1/auth/password-reset/complete/route";
import * as signup from "@/app/api/v1/auth/signup/route";
import * as invitations from "@/app/api/v1/workspaces/[ws]/invitations/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as me from "@/app/api/v1/me/route";
import { BASE, call, linkIn, mailTo, makeUser, makeWorkspace, tag } from "./helpers";

beforeEach(() => {
  for (const l of Object.values(limiters)) l.reset();
});

describe("sign-in by e-mail link", () => {
  it("mails a link whose token signs the user in once", async () => {
    const u = await makeUser("linker");
    const r = await call(emailLink.POST, "POST", "/auth/email-link", { body: { email: u.email.toUpperCase() } });
    expect(r.status).toBe(202);
    const mail = await mailTo(u.email);
    expect(mail.subject).toMatch(/sign-in link/i);
    const link = linkIn(mail.text);
    expect(link.origin).toBe(new URL(BASE).origin);
    expect(link.pathname).toBe("/signin/link");
    expect(mail.html).toContain(`href="${link.toString().replace(/&/g, "&amp;")}"`);
    const token = link.searchParams.get("token")!;
    const signedIn = await authorizeEmailLink({ token });
    expect(signedIn).toMatchObject({ id: u.id, email: u.email });
    expect(await authorizeEmailLink({ token })).toBeNull(); // single use
    expect((await db().models.User.findByPk(u.id))!.emailVerifiedAt).not.toBeNull();
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const email = `nobody-${tag()}@test.ferrow.example`;
    const r = await call(emailLink.POST, "POST", "/auth/email-link", { body: { email } });
    expect(r.status).toBe(202);
    expect(await db().models.EmailToken.count({ where: { email } })).toBe(0);
  });

  it("refuses an expired link", async () => {
    const u = await makeUser("late");
    const secret = randomSecret();
    await db().models.EmailToken.create({ purpose: "signin", email: u.email, tokenHash: sha256(secret), expiresAt: new Date(Date.now() - 1000), usedAt: null });
    expect(await authorizeEmailLink({ token: secret })).toBeNull();
  });
});

describe("password reset by e-mail", () => {
  it("sets a new password once; the old one stops working", async () => {
    const u = await makeUser("forgetful", await hashPassword("old-sluice-password"));
    expect(await authorizePassword({ email: u.email, password: "old-sluice-password" })).toMatchObject({ id: u.id });
    const r = await call(reset.POST, "POST", "/auth/password-reset", { body: { email: u.email } });
    expect(r.status).toBe(202);
    const link = linkIn((await mailTo(u.email)).text);
    expect(link.pathname).toBe("/reset");
    const token = link.searchParams.get("token")!;
    const short = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "short" } });
    expect(short.status).toBe(400);
    const done = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "new-sluice-password" } });
    expect(done.status).toBe(200);
    expect(await authorizePassword({ email: u.email, password: "new-sluice-password" })).toMatchObject({ id: u.id });
    expect(await authorizePassword({ email: u.email, password: "old-sluice-password" })).toBeNull();
    const again = await call(resetComplete.POST, "POST", "/auth/password-reset/complete", { body: { token, password: "third-sluice-password" } });
    expect(again.status).toBe(400);
    expect(await authorizePassword({ email: u.email, password: "third-sluice-password" })).toBeNull();
  });
});

describe("sign-up", () => {
  it("creates an account that can sign in with its password; a second sign-up with the address is 409", async () => {
    const email = `new-${tag()}@test.ferrow.example`;
    const r = await call(signup.POST, "POST", "/auth/signup", { body: { email, name: "Nia Lockwood", password: "paddle-and-gate" } });
    expect(r.status).toBe(201);
    expect(r.json.user).toMatchObject({ email, name: "Nia Lockwood" });
    expect(await authorizePassword({ email, password: "paddle-and-gate" })).toMatchObject({ id: r.json.user.id });
    const hash = (await db().models.User.findByPk(r.json.user.id))!.passwordHash!;
    expect(hash).toMatch(/^\$2[aby]\$12\$/); // bcrypt modular crypt format, cost 12
    const dup = await call(signup.POST, "POST", "/auth/signup", { body: { email: email.toUpperCase(), name: "Other", password: "paddle-and-gate" } });
    expect(dup.status).toBe(409);
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
});
