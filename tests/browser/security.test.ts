/**
 * The security of the running server, through HTTP and Chromium: response
 * headers, no captured mail from the app, sign-in limits and refused forms
 * through next-auth itself, and the account pages that end sessions, confirm
 * an address and reset a password (mail read from the catcher's own page).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomBytes } from "node:crypto";
import { BASE_URL, openBrowser, screenshot, type Session } from "../support/browser";

const MAIL_VIEW_URL = process.env.FANBOUND_MAIL_VIEW_URL ?? `http://127.0.0.1:${2626 + Number(process.env.FANBOUND_PORT_OFFSET ?? 0)}/`;
const tag = () => randomBytes(4).toString("hex");

/** The newest message to `to` whose subject matches, from the catcher's page, waiting up to ~15 s. */
async function mailFromCatcher(to: string, subject: RegExp): Promise<{ text: string }> {
  for (let i = 0; i < 150; i++) {
    const list = (await (await fetch(new URL("/messages.json", MAIL_VIEW_URL))).json()) as Array<{ to: string[]; subject: string; text: string }>;
    const m = list.find((x) => x.to.includes(to) && subject.test(x.subject));
    if (m) return m;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} about ${subject}`);
}

function linkIn(text: string): string {
  const m = new RegExp(`${BASE_URL.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}/\\S+`).exec(text);
  if (!m) throw new Error(`no link in ${text}`);
  return m[0];
}

/** next-auth's CSRF token and the cookie that goes with it. */
async function csrf(base = BASE_URL): Promise<{ token: string; cookie: string }> {
  const r = await fetch(`${base}/api/auth/csrf`);
  const cookie = r.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  return { token: ((await r.json()) as { csrfToken: string }).csrfToken, cookie };
}

/** A second server process of the same build on another port (lib/scripts/test.mjs starts it). */
const SECOND_URL = process.env.FANBOUND_SECOND_BASE_URL;

/** A password sign-in POST as next-auth's client sends it, with the fields given, to the server at `base`. */
async function signInPost(fields: Array<[string, string]>, base = BASE_URL) {
  const { token, cookie } = await csrf(base);
  return fetch(`${base}/api/auth/callback/password`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie },
    body: new URLSearchParams([...fields, ["csrfToken", token], ["json", "true"]]).toString(),
  });
}

describe("headers of pages and API answers", () => {
  it("every page and API answer carries the policy and the security headers; no outside origin is allowed", async () => {
    for (const path of ["/", "/signin", "/w/ferrow-controls", "/api/v1/openapi.json", "/api/v1/me", "/api/auth/csrf"]) {
      const r = await fetch(`${BASE_URL}${path}`, { redirect: "manual" });
      const csp = r.headers.get("content-security-policy") ?? "";
      expect(csp, path).toMatch(/default-src 'self'/);
      // Scripts from this site only (inline ones for Next's page bootstrap; see next.config.mjs).
      expect(csp, path).toMatch(/script-src 'self' 'unsafe-inline'(;|$)/);
      expect(csp, path).toContain("frame-ancestors 'none'");
      expect(csp, path).toContain("object-src 'none'");
      expect(csp, path).toContain("worker-src 'self' blob:");
      expect(csp, path).not.toMatch(/https?:|\*/);
      expect(r.headers.get("x-content-type-options"), path).toBe("nosniff");
      expect(r.headers.get("referrer-policy"), path).toBe("same-origin");
      expect(r.headers.get("x-frame-options"), path).toBe("DENY");
    }
  });

  it("the app serves no captured mail", async () => {
    expect((await fetch(`${BASE_URL}/dev/mail`)).status).toBe(404);
  });
});

describe("sign-in through next-auth", () => {
  it("refuses a duplicated e-mail field (400) and limits guesses at one account whatever else is sent", async () => {
    const victim = `victim-${tag()}@test.ferrow.example`;
    const dup = await signInPost([["email", `decoy-${tag()}@test.ferrow.example`], ["email", victim], ["password", "guess-0"]]);
    expect(dup.status).toBe(400);
    const statuses: number[] = [];
    for (let i = 1; i <= 11; i++) {
      // Each guess spells the address differently; the limit counts the address the password is checked against.
      const spelled = i % 2 ? victim.toUpperCase() : ` ${victim}`;
      statuses.push((await signInPost([["email", spelled], ["password", `guess-${i}`]])).status);
    }
    expect(statuses.slice(0, 10).every((s) => s !== 429)).toBe(true);
    expect(statuses[10]).toBe(429);
  });

  it("two server processes on two ports count against one limit", async () => {
    if (!SECOND_URL) throw new Error("FANBOUND_SECOND_BASE_URL is not set: run the browser tests through npm test");
    const victim = `shared-${tag()}@test.ferrow.example`;
    const statuses: Array<[string, number]> = [];
    for (let i = 1; i <= 11; i++) {
      // Guesses alternate between the servers; each process alone saw at most six.
      const base = i % 2 ? BASE_URL : SECOND_URL;
      statuses.push([base, (await signInPost([["email", victim], ["password", `guess-${i}`]], base)).status]);
    }
    expect(statuses.slice(0, 10).every(([, s]) => s !== 429)).toBe(true);
    // The eleventh guess reaches the first server, which had seen only five: the sixth it refuses is the shared count.
    expect(statuses[10]).toEqual([BASE_URL, 429]);
    // And the second server refuses the account too.
    expect((await signInPost([["email", victim], ["password", "guess-12"]], SECOND_URL)).status).toBe(429);
  });
});

describe("account pages in chromium", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
  });
  afterAll(async () => {
    await s?.close();
  });

  it("sign up, confirm the address from the mailed link, sign out everywhere, then reset the password and revoke tokens", async () => {
    const { page, context } = s;
    const email = `keeper-${tag()}@test.ferrow.example`;
    await page.goto(`${BASE_URL}/signup`);
    await page.fill('input[name="name"]', "Tam Culvert");
    await page.fill('input[name="email"]', email);
    // A common password is refused at once, with what to change.
    await page.fill('input[name="password"]', "password123");
    await page.click('button[type="submit"]');
    await expect(page.locator("form [role=alert]").innerText({ timeout: 15_000 })).resolves.toMatch(/unrelated words/);
    await page.fill('input[name="password"]', "heron-lantern-towpath");
    await page.click('button[type="submit"]');
    await page.waitForURL(/\/workspaces/, { timeout: 30_000 });

    await page.goto(`${BASE_URL}/account`);
    await expect(page.getByText(/not confirmed yet/).count()).resolves.toBe(1);
    const confirm = linkIn((await mailFromCatcher(email, /confirm your address/i)).text);
    await page.goto(confirm);
    await page.getByRole("button", { name: "Confirm my address" }).click();
    await expect(page.locator("[role=status]").innerText({ timeout: 15_000 })).resolves.toContain(`${email} is confirmed`);
    await screenshot(page, "address-confirmed");

    await page.goto(`${BASE_URL}/account`);
    await expect(page.getByText("(confirmed)").count()).resolves.toBe(1);
    const cookies = (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
    expect((await fetch(`${BASE_URL}/api/v1/me`, { headers: { cookie: cookies } })).status).toBe(200);
    await screenshot(page, "account-sessions");
    await page.getByRole("button", { name: "Sign out everywhere" }).click();
    await page.waitForURL(/\/signin/, { timeout: 30_000 });
    // The cookie taken before is dead, wherever a copy of it is.
    expect((await fetch(`${BASE_URL}/api/v1/me`, { headers: { cookie: cookies } })).status).toBe(401);

    await page.goto(`${BASE_URL}/reset`);
    await page.fill('input[name="email"]', email);
    await page.click('button[type="submit"]');
    await page.waitForSelector("[role=status]");
    await page.goto(linkIn((await mailFromCatcher(email, /reset/i)).text));
    await page.fill('input[name="password"]', "otter-bollard-sluice");
    await page.fill('input[name="again"]', "otter-bollard-sluice");
    await page.getByLabel(/Also revoke my personal API tokens/).check();
    await screenshot(page, "reset-form");
    await page.click('button[type="submit"]');
    await expect(page.locator("[role=status]").innerText({ timeout: 15_000 })).resolves.toMatch(/every session of the account has ended\. 0 API tokens were revoked/);
    expect(s.outside).toEqual([]);
    expect(await s.cspViolations()).toEqual([]);
  });
});
