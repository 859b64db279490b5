/**
 * Bodies, tokens, limits, revisions and the OpenAPI document, on the real
 * database through the route handlers.
 */
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/lib/db/connection";
import { Sequelize } from "sequelize";
import pg from "pg";
import { LIMITS, createLimitStore, enforceLimits } from "@/lib/api/rate-limit";
import { MAX_JSON_DEPTH } from "@/lib/api/body";
import { createToken, revokeToken } from "@/lib/data/tokens";
import { registry } from "@/lib/api/registry";
import * as me from "@/app/api/v1/me/route";
import * as workspaces from "@/app/api/v1/workspaces/route";
import * as designs from "@/app/api/v1/workspaces/[ws]/designs/route";
import * as design from "@/app/api/v1/workspaces/[ws]/designs/[designId]/route";
import * as revisions from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/route";
import * as families from "@/app/api/v1/workspaces/[ws]/families/route";
import * as tokensRoute from "@/app/api/v1/tokens/route";
import * as signup from "@/app/api/v1/auth/signup/route";
import * as reset from "@/app/api/v1/auth/password-reset/route";
import * as emailLink from "@/app/api/v1/auth/email-link/route";
import * as compile from "@/app/api/v1/compile/route";
import * as openapi from "@/app/api/v1/openapi.json/route";
import * as nextauth from "@/app/api/auth/[...nextauth]/route";
import * as member from "@/app/api/v1/workspaces/[ws]/members/[userId]/route";
import * as workspace from "@/app/api/v1/workspaces/[ws]/route";
import * as revision from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/route";
import * as exporter from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/export/route";
import { encode } from "next-auth/jwt";
import { BASE, SOURCE, builtinFamily, call, counts, makeUser, makeWorkspace, resetLimits, tag, type TestUser, addMember } from "./helpers";

let owner: TestUser;
let ws: { id: string; slug: string };
let familyId: string;
let designId: string;

beforeAll(async () => {
  owner = await makeUser("owner");
  ws = await makeWorkspace("api", owner);
  familyId = (await builtinFamily()).id;
  const r = await call(designs.POST, "POST", "/d", { token: owner.token, params: { ws: ws.slug }, body: { name: `Upper gate ${tag()}`, familyId, draftSource: SOURCE } });
  expect(r.status).toBe(201);
  designId = r.json.design.id;
});

beforeEach(async () => {
  await resetLimits();
});

describe("bad bodies are refused in the error shape and change nothing", () => {
  const big = JSON.stringify({ name: "x".repeat(300 * 1024), slug: "too-big" });
  const cases: Array<[string, Parameters<typeof call>[3], number, string]> = [
    ["malformed JSON", { rawBody: '{"name": "Weir", "slug":', headers: { "content-type": "application/json" } }, 400, "malformed_json"],
    ["empty body", { rawBody: "", headers: { "content-type": "application/json" } }, 400, "malformed_json"],
    ["not JSON at all", { rawBody: "name=Weir&slug=weir", headers: { "content-type": "application/x-www-form-urlencoded" } }, 415, "unsupported_media_type"],
    ["no content type", { rawBody: '{"name":"Weir","slug":"weir-x"}' }, 415, "unsupported_media_type"],
    ["wrong types", { body: { name: 42, slug: ["a"] } }, 400, "invalid_input"],
    ["unknown field", { body: { name: "Weir", slug: `weir-${tag()}`, owner: "me" } }, 400, "invalid_input"],
    ["bad slug", { body: { name: "Weir", slug: "Not A Slug!" } }, 400, "invalid_input"],
    ["a JSON array", { body: [1, 2, 3] }, 400, "invalid_input"],
    ["over 256 KiB with Content-Length", { rawBody: big, headers: { "content-type": "application/json", "content-length": String(big.length) } }, 413, "payload_too_large"],
  ];
  for (const [name, c, status, code] of cases) {
    it(`${name} → ${status}`, async () => {
      const before = await counts();
      const r = await call(workspaces.POST, "POST", "/workspaces", { token: owner.token, ...c });
      expect(r.status).toBe(status);
      expect(r.json.error).toMatchObject({ code, message: expect.any(String) });
      expect(r.json.error).toHaveProperty("details");
      if (code === "invalid_input") expect(r.json.error.details[0]).toMatchObject({ path: expect.any(String), message: expect.any(String) });
      expect(await counts()).toEqual(before);
    });
  }

  it("NUL anywhere in a JSON body → 400 naming the field; nothing stored", async () => {
    const before = await counts();
    const settingsNul = await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: { ws: ws.slug }, body: { settings: { note: "lock\u0000gate" } } });
    expect(settingsNul.status).toBe(400);
    expect(settingsNul.json.error.message).toContain("body.settings.note");
    expect(settingsNul.json.error.details[0]).toMatchObject({ path: "settings.note", code: "nul_character" });
    const deep = await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: { ws: ws.slug }, body: { settings: { list: [{ a: "x" }, { b: "\u0000" }] } } });
    expect(deep.json.error.details[0]).toMatchObject({ path: "settings.list.1.b" });
    const inKey = await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: { ws: ws.slug }, body: { settings: { "a\u0000b": 1 } } });
    expect(inKey.status).toBe(400);
    const family = await call(families.POST, "POST", "/f", { token: owner.token, params: { ws: ws.slug }, body: { key: "nul-fam", name: "Weir\u0000", data: {} } });
    expect(family.status).toBe(400);
    expect(family.json.error.message).toContain("body.name");
    const source = await call(revisions.POST, "POST", "/r", { token: owner.token, params: { ws: ws.slug, designId }, body: { message: "m", source: `${SOURCE}// \u0000`, familyId, settings: {} } });
    expect(source.status).toBe(400);
    expect(source.json.error.message).toContain("body.source");
    const surrogate = await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: { ws: ws.slug }, rawBody: '{"name":"Weir \\ud800"}', headers: { "content-type": "application/json" } });
    expect(surrogate.status).toBe(400);
    expect(surrogate.json.error.details[0]).toMatchObject({ path: "name", code: "lone_surrogate" });
    const query = await call(designs.GET, "GET", "/d", { token: owner.token, params: { ws: ws.slug }, query: { q: "a\u0000" } });
    expect(query.status).toBe(400);
    expect(query.json.error.message).toContain("query.q");
    expect(await counts()).toEqual(before);
  });

  it(`JSON nested deeper than ${MAX_JSON_DEPTH} levels → 400 before parsing; at the limit it is read`, async () => {
    const nest = (n: number) => `${"[".repeat(n)}${"]".repeat(n)}`;
    const tooDeep = await call(workspace.PATCH, "PATCH", "/w", {
      token: owner.token, params: { ws: ws.slug }, rawBody: `{"settings":{"x":${nest(5000)}}}`, headers: { "content-type": "application/json" },
    });
    expect(tooDeep.status).toBe(400);
    expect(tooDeep.json.error.message).toMatch(new RegExp(`more than ${MAX_JSON_DEPTH} levels`));
    // The body's object and settings are two levels: 30 more make exactly the limit.
    const atLimit = await call(workspace.PATCH, "PATCH", "/w", {
      token: owner.token, params: { ws: ws.slug }, rawBody: `{"settings":{"x":${nest(MAX_JSON_DEPTH - 2)}, "s": "[[[[ brackets in a string do not count"}}`, headers: { "content-type": "application/json" },
    });
    expect(atLimit.status).toBe(200);
  });

  it("a query parameter given twice → 400", async () => {
    const r = await call(designs.GET, "GET", `/d?sort=name&sort=gates`, { token: owner.token, params: { ws: ws.slug } });
    expect(r.status).toBe(400);
    expect(r.json.error.message).toMatch(/sort more than once/);
  });

  it("a streamed body over the limit is cut off without trusting any Content-Length → 413", async () => {
    const before = await counts();
    const chunk = new TextEncoder().encode(`{"name":"${"y".repeat(64 * 1024)}`);
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(ctrl) {
        if (sent++ < 8) ctrl.enqueue(chunk);
        else ctrl.close();
      },
    });
    const req = new Request(`${BASE}/api/v1/workspaces`, {
      method: "POST",
      headers: { "content-type": "application/json", authorization: `Bearer ${owner.token}` },
      body: stream,
      duplex: "half",
    } as RequestInit);
    const res = await workspaces.POST(req, { params: Promise.resolve({}) });
    expect(res.status).toBe(413);
    expect((await res.json()).error.code).toBe("payload_too_large");
    expect(await counts()).toEqual(before);
  });

  it("bad revision bodies store no revision; a source with errors → 422 with diagnostics", async () => {
    const before = await counts();
    const p = { ws: ws.slug, designId };
    const bad = await call(revisions.POST, "POST", "/r", { token: owner.token, params: p, body: { message: "x", source: SOURCE, familyId, settings: { fanIn: 1 } } });
    expect(bad.status).toBe(400);
    const stats = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: p, body: { message: "x", source: SOURCE, familyId, settings: {}, stats: { gates: 1 } },
    });
    expect(stats.status).toBe(400); // figures from the client are refused outright
    const broken = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: p, body: { message: "x", source: "inputs a\noutputs f\nf = a *\n", familyId, settings: {} },
    });
    expect(broken.status).toBe(422);
    expect(broken.json.error.code).toBe("compile_errors");
    expect(broken.json.error.details.diagnostics[0]).toMatchObject({ severity: "error", line: expect.any(Number) });
    expect(await counts()).toEqual(before);
  });

  it("a family that fails the family validator → 400 naming the field", async () => {
    const before = await counts();
    const r = await call(families.POST, "POST", "/f", { token: owner.token, params: { ws: ws.slug }, body: { key: "bad-fam", name: "Bad", data: { supplyV: -5, fanIn: 1 } } });
    expect(r.status).toBe(400);
    expect(r.json.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(["data.supplyV", "data.fanIn"]));
    expect(await counts()).toEqual(before);
  });
});

describe("personal API tokens", () => {
  it("are shown once, stored as a SHA-256 hash, and stop working when revoked", async () => {
    const u = await makeUser("tokens");
    const created = await call(tokensRoute.POST, "POST", "/tokens", {
      token: u.token, body: { name: "ci", expiresAt: new Date(Date.now() + 30 * 86_400_000).toISOString() },
    });
    expect(created.status).toBe(201);
    const secret: string = created.json.secret;
    expect(secret.startsWith(created.json.token.prefix)).toBe(true);
    const row = await db().models.ApiToken.findByPk(created.json.token.id);
    // SHA-256 of the secret computed here with Node's crypto (FIPS 180-4).
    const { createHash } = await import("node:crypto");
    expect(row!.tokenHash).toBe(createHash("sha256").update(secret).digest("hex"));
    expect(JSON.stringify(row!.toJSON())).not.toContain(secret);
    const list = await call(tokensRoute.GET, "GET", "/tokens", { token: u.token });
    expect(JSON.stringify(list.json)).not.toContain(secret);

    expect((await call(me.GET, "GET", "/me", { token: secret })).status).toBe(200);
    expect((await db().models.ApiToken.findByPk(created.json.token.id))!.lastUsedAt).not.toBeNull();
    await revokeToken({ actor: { userId: u.id, via: "token" }, id: created.json.token.id });
    const after = await call(me.GET, "GET", "/me", { token: secret });
    expect(after.status).toBe(401);
    expect(after.json.error.code).toBe("unauthenticated");
  });

  it("stop working when expired, and cannot be made for more than 365 days", async () => {
    const u = await makeUser("expiry");
    const past = new Date(Date.now() - 2 * 86_400_000);
    const { secret } = await createToken({ actor: { userId: u.id, via: "token" }, name: "old", expiresAt: new Date(Date.now() - 1000), now: past });
    expect((await call(me.GET, "GET", "/me", { token: secret })).status).toBe(401);
    const tooLong = await call(tokensRoute.POST, "POST", "/tokens", {
      token: u.token, body: { name: "forever", expiresAt: new Date(Date.now() + 366 * 86_400_000).toISOString() },
    });
    expect(tooLong.status).toBe(400);
    const noExpiry = await call(tokensRoute.POST, "POST", "/tokens", { token: u.token, body: { name: "forever" } });
    expect(noExpiry.status).toBe(400);
  });

  it("a malformed or unknown Bearer header is 401, not anonymous", async () => {
    expect((await call(me.GET, "GET", "/me", { headers: { authorization: "Bearer fb_not-a-token" } })).status).toBe(401);
    expect((await call(me.GET, "GET", "/me", { headers: { authorization: "Basic abc" } })).status).toBe(401);
    expect((await call(openapi.GET, "GET", "/openapi.json", { headers: { authorization: "Bearer nope" } })).status).toBe(401);
  });
});

describe("session cookie", () => {
  it("a next-auth JWT in the session cookie authenticates; one signed with another secret does not", async () => {
    const u = await makeUser("cookie");
    const good = await encode({ token: { sub: u.id, email: u.email, sv: 0 }, secret: process.env.NEXTAUTH_SECRET! });
    const ok = await call(me.GET, "GET", "/me", { headers: { cookie: `next-auth.session-token=${good}` } });
    expect(ok.status).toBe(200);
    expect(ok.json.user.id).toBe(u.id);
    const forged = await encode({ token: { sub: u.id, sv: 0 }, secret: "not-the-server-secret" });
    expect((await call(me.GET, "GET", "/me", { headers: { cookie: `next-auth.session-token=${forged}` } })).status).toBe(401);
    // A JWT without a session version (or an older one) is a session that has ended.
    const old = await encode({ token: { sub: u.id }, secret: process.env.NEXTAUTH_SECRET! });
    expect((await call(me.GET, "GET", "/me", { headers: { cookie: `next-auth.session-token=${old}` } })).status).toBe(401);
  });
});

describe("members", () => {
  it("the last owner can neither step down nor be removed (409)", async () => {
    const o = await makeUser("sole");
    const w = await makeWorkspace("sole", o);
    const demote = await call(member.PATCH, "PATCH", "/m", { token: o.token, params: { ws: w.slug, userId: o.id }, body: { role: "viewer" } });
    expect(demote.status).toBe(409);
    const remove = await call(member.DELETE, "DELETE", "/m", { token: o.token, params: { ws: w.slug, userId: o.id } });
    expect(remove.status).toBe(409);
    const m = await db().models.Membership.findOne({ where: { workspaceId: w.id, userId: o.id } });
    expect(m!.role).toBe("owner");
  });

  it("two owners stepping down at the same moment leave one owner: the second gets 409", async () => {
    const a = await makeUser("pair-a");
    const w = await makeWorkspace("pair", a);
    const b = await makeUser("pair-b");
    await addMember(w.id, b, "owner");
    const [ra, rb] = await Promise.all([
      call(member.PATCH, "PATCH", "/m", { token: a.token, params: { ws: w.slug, userId: a.id }, body: { role: "designer" } }),
      call(member.PATCH, "PATCH", "/m", { token: b.token, params: { ws: w.slug, userId: b.id }, body: { role: "designer" } }),
    ]);
    expect([ra.status, rb.status].sort()).toEqual([200, 409]);
    expect(await db().models.Membership.count({ where: { workspaceId: w.id, role: "owner" } })).toBe(1);
  });
});

describe("rate limits", () => {
  /** Counts `n` requests of `subject` against one limit, as a route would. */
  async function spend(name: keyof typeof LIMITS, subject: Parameters<typeof enforceLimits>[1], n: number) {
    for (let i = 0; i < n; i++) await enforceLimits([name], subject);
  }

  /** A sign-in POST the way next-auth's client sends it. */
  function signInRequest(fields: Array<[string, string]>, provider = "password") {
    return nextauth.POST(
      new Request(`${BASE}/api/auth/callback/${provider}`, {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded" },
        body: new URLSearchParams(fields).toString(),
      }),
      { params: Promise.resolve({ nextauth: ["callback", provider] }) },
    );
  }

  it("two server processes share one limit: counters live in PostgreSQL, not in a process", async () => {
    // A second process, as far as the limiter can tell: its own connection pool and its own limiter objects.
    const other = new Sequelize(process.env.DATABASE_URL!, { dialect: "postgres", dialectModule: pg, logging: false });
    try {
      const elsewhere = createLimitStore(other);
      const u = await makeUser("shared");
      for (let i = 0; i < LIMITS.compile.points; i++) await enforceLimits(["compile"], { caller: "direct", userId: u.id }, elsewhere);
      // This process's route handler now refuses the user.
      const r = await call(compile.POST, "POST", "/compile", { token: u.token, body: { source: SOURCE, familyKey: "cmos-hc-5v" } });
      expect(r.status).toBe(429);
      expect(r.json.error).toMatchObject({ code: "rate_limited", details: { limit: "compile" } });
      const wait = Number(r.headers.get("retry-after"));
      expect(wait).toBeGreaterThanOrEqual(1);
      expect(wait).toBeLessThanOrEqual(LIMITS.compile.seconds);
      // Another user is not affected, and the first is let through again once the window is over (here: forgotten).
      const v = await makeUser("shared-other");
      expect((await call(compile.POST, "POST", "/compile", { token: v.token, body: { source: SOURCE, familyKey: "cmos-hc-5v" } })).status).toBe(200);
      await resetLimits();
      expect((await call(compile.POST, "POST", "/compile", { token: u.token, body: { source: SOURCE, familyKey: "cmos-hc-5v" } })).status).toBe(200);
    } finally {
      await other.close();
    }
  });

  it("the counters hold no addresses: keys are hashes", async () => {
    const email = `private-${tag()}@test.ferrow.example`;
    await enforceLimits(["mailAddress"], { caller: "direct", email });
    const [rows] = await db().sequelize.query("SELECT key FROM rate_limits");
    expect((rows as Array<{ key: string }>).map((r) => r.key).join(" ")).not.toContain(email);
    expect((rows as Array<{ key: string }>)[0]!.key).toMatch(/^mailAddress:[0-9a-f]{64}$/);
  });

  it("saving revisions counts against the compile limit, declared on the route", async () => {
    const u = await makeUser("saver");
    const w = await makeWorkspace("saver", u);
    const d = await call(designs.POST, "POST", "/d", { token: u.token, params: { ws: w.slug }, body: { name: "Lamp", familyId } });
    await spend("compile", { caller: "direct", userId: u.id }, LIMITS.compile.points);
    const r = await call(revisions.POST, "POST", "/r", {
      token: u.token, params: { ws: w.slug, designId: d.json.design.id }, body: { message: "x", source: SOURCE, familyId, settings: {} },
    });
    expect(r.status).toBe(429);
  });

  it("sign-up: 429 per caller once its limit is used; a forged X-Forwarded-For does not open a new window", async () => {
    const statuses: number[] = [];
    for (let i = 0; i <= LIMITS.signUp.points; i++) {
      const ip = { "x-forwarded-for": `203.0.113.${i + 1}` }; // documentation range, RFC 5737
      const r = await call(signup.POST, "POST", "/auth/signup", { headers: ip, body: { email: `s${i}-${tag()}@test.ferrow.example`, name: "Sam", password: "lock-keeper-pass" } });
      statuses.push(r.status);
      if (r.status === 429) expect(r.headers.get("retry-after")).toMatch(/^\d+$/);
    }
    expect(statuses).toEqual([...Array(LIMITS.signUp.points).fill(202), 429]);
  });

  it("mail to one address is limited whoever asks; each caller is limited whatever the address", async () => {
    const u = await makeUser("inbox");
    await spend("mailAddress", { caller: "elsewhere", email: u.email }, LIMITS.mailAddress.points);
    const r = await call(reset.POST, "POST", "/auth/password-reset", { body: { email: u.email.toUpperCase() } });
    expect(r.status).toBe(429);
    expect(r.json.error.details.limit).toBe("mailAddress");
    await resetLimits();
    await spend("mailCaller", { caller: "direct" }, LIMITS.mailCaller.points);
    const fresh = await call(emailLink.POST, "POST", "/auth/email-link", { body: { email: `new-${tag()}@test.ferrow.example` } });
    expect(fresh.status).toBe(429);
    expect(fresh.json.error.details.limit).toBe("mailCaller");
  });

  it("sign-in: a duplicated form field is refused (400) before any counting or checking", async () => {
    const victim = await makeUser("victim");
    const decoy = `decoy-${tag()}@test.ferrow.example`;
    const res = await signInRequest([["email", decoy], ["email", victim.email], ["password", "guess-1"], ["csrfToken", "x"]]);
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.message).toMatch(/email more than once/);
    expect(new URL(body.url).searchParams.get("error")).toBe("BadRequest");
    const json = await nextauth.POST(
      new Request(`${BASE}/api/auth/callback/password`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: victim.email, password: "x" }) }),
      { params: Promise.resolve({ nextauth: ["callback", "password"] }) },
    );
    expect(json.status).toBe(415);
  });

  it("sign-in: the limit counts the address the password is checked against, from any spelling of it", async () => {
    const victim = await makeUser("victim");
    // The per-account window of this caller is used up by guesses at the address in another spelling.
    await spend("signInAccount", { caller: "direct", email: `  ${victim.email.toUpperCase()} ` }, LIMITS.signInAccount.points);
    const res = await signInRequest([["email", victim.email], ["password", "guess"], ["csrfToken", "x"]]);
    expect(res.status).toBe(429);
    expect(res.headers.get("retry-after")).toMatch(/^\d+$/);
    expect(new URL((await res.json()).url).searchParams.get("error")).toBe("RateLimited");
  });

  it("sign-in: one caller guessing at many accounts is limited too", async () => {
    await spend("signInCaller", { caller: "direct" }, LIMITS.signInCaller.points);
    const res = await signInRequest([["email", `someone-${tag()}@test.ferrow.example`], ["password", "guess"], ["csrfToken", "x"]]);
    expect(res.status).toBe(429);
    const link = await signInRequest([["token", "x".repeat(40)], ["csrfToken", "x"]], "email-link");
    expect(link.status).toBe(429);
  });
});

describe("designs and revisions", () => {
  it("the server computes the stored figures: a two-term cover of the upper gate permit", async () => {
    const r = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: { ws: ws.slug, designId }, body: { message: "first save", source: SOURCE, familyId, settings: {} },
    });
    expect(r.status).toBe(201);
    // By hand: estop'·lower_shut·(level_upper + override_key) has the minimum SOP
    // estop'·lower_shut·level_upper + estop'·lower_shut·override_key: 2 products, 6 literals.
    expect(r.json.revision.stats).toMatchObject({ inputs: 4, outputs: 1, products: 2, literals: 6, exact: true, verified: true });
    expect(r.json.revision.stats.gates).toBeGreaterThan(0);
    const d = await call(design.GET, "GET", "/d", { token: owner.token, params: { ws: ws.slug, designId } });
    expect(d.json.design.latestRevision).toMatchObject({ number: r.json.revision.number, message: "first save", author: { id: owner.id } });
  });

  it("a revision's files come from the netlist saved with it", async () => {
    const r = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: { ws: ws.slug, designId }, body: { message: "files", source: SOURCE, familyId, settings: {} },
    });
    expect(r.status).toBe(201);
    const number = String(r.json.revision.number);
    const row = await db().models.Revision.findOne({ where: { designId, number: Number(number) } });
    const saved = row!.netlist as unknown as { document: { gates: Array<{ id: string; type: string }> } };
    expect(saved.document.gates.length).toBe(r.json.revision.stats.gates);
    const json = await call(exporter.GET, "GET", "/x", { token: owner.token, params: { ws: ws.slug, designId, number }, query: { format: "json" } });
    expect(json.status).toBe(200);
    expect(JSON.parse(json.text)).toEqual(saved.document);
    // IEEE 1364 gate primitives: one instance line per saved gate, named by its id.
    const v = await call(exporter.GET, "GET", "/x", { token: owner.token, params: { ws: ws.slug, designId, number }, query: { format: "verilog" } });
    for (const g of saved.document.gates) expect(v.text).toMatch(new RegExp(`\\b${g.type.toLowerCase()}\\s+${g.id}\\(`));
  });

  it("the compile answer carries the two-level and the factored structure; a revision keeps the one its settings choose", async () => {
    // Parity of four inputs: its two-level cover is all eight odd minterms (no two adjacent), while three
    // two-input XOR gates build it (a textbook parity tree; the family offers XOR2).
    const PARITY = "// Ferrow Lock & Weir: odd count of open sluices\ninputs s1, s2, s3, s4\noutputs odd\nodd = s1 ^ s2 ^ s3 ^ s4\n";
    const c = await call(compile.POST, "POST", "/compile", { token: owner.token, body: { source: PARITY, familyKey: "cmos-hc-5v" } });
    expect(c.status).toBe(200);
    const structures = c.json.result.structures as Array<{ structure: string; kept: boolean; gates: number; levels: number; verified: boolean }>;
    expect(structures.map((x) => [x.structure, x.kept])).toEqual([["two-level", true], ["factored", false]]);
    expect(structures.every((x) => x.verified)).toBe(true);
    expect(structures[1]).toMatchObject({ gates: 3, levels: 2 });
    expect(c.json.result.stats).toMatchObject({ structure: "two-level", gates: structures[0]!.gates });

    const r = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: { ws: ws.slug, designId }, body: { message: "factored parity", source: PARITY, familyId, settings: { structure: "factored" } },
    });
    expect(r.status).toBe(201);
    expect(r.json.revision.settings).toMatchObject({ structure: "factored" });
    expect(r.json.revision.stats).toMatchObject({ structure: "factored", gates: 3, depth: 2, verified: true });
    const number = String(r.json.revision.number);
    const v = await call(exporter.GET, "GET", "/x", { token: owner.token, params: { ws: ws.slug, designId, number }, query: { format: "verilog" } });
    // IEEE 1364 gate primitives: the saved netlist is the three XOR gates
    expect(v.text.match(/\bxor\s+\w+\(/g)?.length).toBe(3);
    expect(v.text).toMatch(/factored/);
    const bad = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: { ws: ws.slug, designId }, body: { message: "x", source: PARITY, familyId, settings: { structure: "three-level" } },
    });
    expect(bad.status).toBe(400);
  });

  it("concurrent saves get distinct consecutive numbers", async () => {
    const p = { ws: ws.slug, designId };
    const before = (await db().models.Revision.max("number", { where: { designId } })) as number | null;
    const results = await Promise.all(
      [1, 2, 3, 4].map((i) => call(revisions.POST, "POST", "/r", { token: owner.token, params: p, body: { message: `save ${i}`, source: SOURCE, familyId, settings: {} } })),
    );
    expect(results.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    const numbers = results.map((r) => r.json.revision.number as number).sort((a, b) => a - b);
    const b = before ?? 0;
    expect(numbers).toEqual([b + 1, b + 2, b + 3, b + 4]);
  });

  it("revisions are immutable: UPDATE and DELETE refused through Sequelize and raw SQL", async () => {
    const rev = await db().models.Revision.findOne({ where: { designId } });
    expect(rev).not.toBeNull();
    const original = rev!.message;
    await expect(rev!.update({ message: "rewritten" })).rejects.toThrow(/immutable/);
    await expect(rev!.destroy()).rejects.toThrow(/immutable/);
    const { sequelize } = db();
    // The app's role has no right to change a revision at all; the owner's is stopped by the trigger (below).
    await expect(sequelize.query("UPDATE revisions SET message = 'rewritten' WHERE id = :id", { replacements: { id: rev!.id } })).rejects.toThrow(/permission denied|immutable/);
    await expect(sequelize.query("DELETE FROM revisions WHERE id = :id", { replacements: { id: rev!.id } })).rejects.toThrow(/permission denied|immutable/);
    const again = await db().models.Revision.findByPk(rev!.id);
    expect(again!.message).toBe(original);
  });

  it("the app's database role cannot get past the immutability: no TRUNCATE, no replication role, no superuser", async () => {
    const { sequelize } = db();
    const [[who]] = (await sequelize.query("SELECT current_user AS name, rolsuper, rolbypassrls FROM pg_roles WHERE rolname = current_user")) as [Array<{ name: string; rolsuper: boolean; rolbypassrls: boolean }>, unknown];
    expect(who).toMatchObject({ rolsuper: false, rolbypassrls: false });
    const before = await db().models.Revision.count();
    await expect(sequelize.query("TRUNCATE revisions")).rejects.toThrow(/permission denied|immutable/);
    await expect(sequelize.query("SET session_replication_role = replica")).rejects.toThrow(/permission denied/);
    await expect(sequelize.query("ALTER TABLE revisions DISABLE TRIGGER revisions_immutable")).rejects.toThrow(/must be owner/);
    await expect(sequelize.query("CREATE TABLE sneaky (id int)")).rejects.toThrow(/permission denied/);
    const [[rights]] = (await sequelize.query(
      `SELECT has_table_privilege(current_user, 'revisions', 'UPDATE') AS u, has_table_privilege(current_user, 'revisions', 'DELETE') AS d,
              has_table_privilege(current_user, 'revisions', 'TRUNCATE') AS t, has_table_privilege(current_user, 'revisions', 'INSERT') AS i,
              has_table_privilege(current_user, 'designs', 'TRUNCATE') AS dt, has_table_privilege(current_user, '"SequelizeMeta"', 'SELECT') AS m`,
    )) as [Array<Record<string, boolean>>, unknown];
    expect(rights).toEqual({ u: false, d: false, t: false, i: true, dt: false, m: false });
    expect(await db().models.Revision.count()).toBe(before);
  });

  it.skipIf(!process.env.DATABASE_OWNER_URL)("as the owner role too, TRUNCATE, UPDATE and DELETE of revisions are refused by triggers; new tables get the app's grants", async () => {
    const ownerDb = new Sequelize(process.env.DATABASE_OWNER_URL!, { dialect: "postgres", dialectModule: pg, logging: false });
    try {
      const rev = await db().models.Revision.findOne({ where: { designId } });
      // Reviews and the library revisions a revision pinned refer to revisions, so a plain TRUNCATE stops at the foreign keys; with CASCADE the triggers refuse it.
      await expect(ownerDb.query("TRUNCATE revisions")).rejects.toThrow(/immutable: TRUNCATE refused|cannot truncate a table referenced/);
      await expect(ownerDb.query("TRUNCATE revisions CASCADE")).rejects.toThrow(/immutable: TRUNCATE refused/);
      await expect(ownerDb.query("UPDATE revisions SET message = 'x' WHERE id = :id", { replacements: { id: rev!.id } })).rejects.toThrow(/immutable/);
      await expect(ownerDb.query("DELETE FROM revisions WHERE id = :id", { replacements: { id: rev!.id } })).rejects.toThrow(/immutable/);
      const appRole = decodeURIComponent(new URL(process.env.DATABASE_URL!).username);
      // A table a later migration adds is usable by the app at once (ALTER DEFAULT PRIVILEGES), without TRUNCATE.
      await ownerDb.transaction(async (transaction) => {
        await ownerDb.query("CREATE TABLE later_feature (id int)", { transaction });
        const [[r]] = (await ownerDb.query(
          `SELECT has_table_privilege(:role, 'later_feature', 'SELECT, INSERT, UPDATE, DELETE') AS rw, has_table_privilege(:role, 'later_feature', 'TRUNCATE') AS t`,
          { replacements: { role: appRole }, transaction },
        )) as [Array<{ rw: boolean; t: boolean }>, unknown];
        expect(r).toEqual({ rw: true, t: false });
        await ownerDb.query("DROP TABLE later_feature", { transaction });
      });
    } finally {
      await ownerDb.close();
    }
  });

  it("a revision stores its source byte for byte, unusual Unicode and all", async () => {
    // Legal but unusual text: combining marks, a zero-width joiner sequence, characters outside the BMP,
    // right-to-left text, U+2028/U+2029, a BOM, U+FFFD, tabs and CRLF line ends, a backslash-zero pair.
    const note = "// Wehr \u0301e\u0301 \u{1F468}\u200D\u{1F527} \u{1D4D5} \u05E9\u05DC\u05D5\u05DD \u2028 \u2029 \uFEFF \uFFFD \\0 tab\there";
    const source = `${note}\r\n${SOURCE.replace(/\n/g, "\r\n")}`;
    const r = await call(revisions.POST, "POST", "/r", {
      token: owner.token, params: { ws: ws.slug, designId }, body: { message: "Unicode \u{1F30A} check", source, familyId, settings: {} },
    });
    expect(r.status).toBe(201);
    const bytes = (s: string) => Buffer.from(s, "utf8").toString("hex");
    expect(bytes(r.json.revision.source)).toBe(bytes(source));
    const read = await call(revision.GET, "GET", "/r", { token: owner.token, params: { ws: ws.slug, designId, number: String(r.json.revision.number) } });
    expect(bytes(read.json.revision.source)).toBe(bytes(source));
    expect(read.json.revision.message).toBe("Unicode \u{1F30A} check");
    // What PostgreSQL holds, read back as its own bytes (convert_to), is the UTF-8 of what was sent.
    const [[row]] = (await db().sequelize.query("SELECT encode(convert_to(source, 'UTF8'), 'hex') AS hex FROM revisions WHERE id = :id", {
      replacements: { id: r.json.revision.id },
    })) as [Array<{ hex: string }>, unknown];
    expect(row!.hex).toBe(bytes(source));
  });

  it("lists page with a cursor, search and sort", async () => {
    const w = await makeWorkspace("paging", owner);
    for (const n of ["Alarm", "Beacon", "Chamber", "Display", "Equalise"]) {
      const r = await call(designs.POST, "POST", "/d", { token: owner.token, params: { ws: w.slug }, body: { name: `${n} logic`, familyId } });
      expect(r.status).toBe(201);
    }
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const q: Record<string, string> = { sort: "name", order: "asc", limit: "2" };
      if (cursor) q.cursor = cursor;
      const page = await call(designs.GET, "GET", "/d", { token: owner.token, params: { ws: w.slug }, query: q });
      expect(page.status).toBe(200);
      seen.push(...page.json.items.map((i: { name: string }) => i.name));
      cursor = page.json.nextCursor;
    } while (cursor);
    expect(seen).toEqual(["Alarm logic", "Beacon logic", "Chamber logic", "Display logic", "Equalise logic"]);
    const found = await call(designs.GET, "GET", "/d", { token: owner.token, params: { ws: w.slug }, query: { q: "cham" } });
    expect(found.json.items.map((i: { name: string }) => i.name)).toEqual(["Chamber logic"]);
    const bad = await call(designs.GET, "GET", "/d", { token: owner.token, params: { ws: w.slug }, query: { sort: "colour" } });
    expect(bad.status).toBe(400);
    const one = found.json.items[0].id;
    await call(design.PATCH, "PATCH", "/d", { token: owner.token, params: { ws: w.slug, designId: one }, body: { archived: true } });
    const archived = await call(designs.GET, "GET", "/d", { token: owner.token, params: { ws: w.slug }, query: { archived: "1" } });
    expect(archived.json.items.map((i: { id: string }) => i.id)).toEqual([one]);
    const dup = await call(designs.POST, "POST", "/d", { token: owner.token, params: { ws: w.slug }, body: { name: "Alarm logic", familyId } });
    expect(dup.status).toBe(409);
  });
});

describe("OpenAPI document", () => {
  it("describes every registered route with its request schema", async () => {
    const r = await call(openapi.GET, "GET", "/openapi.json");
    expect(r.status).toBe(200);
    expect(r.json.openapi).toBe("3.1.0");
    for (const spec of registry) {
      const op = r.json.paths[spec.path]?.[spec.method.toLowerCase()];
      expect(op, `${spec.method} ${spec.path}`).toBeDefined();
      if (spec.body) expect(op.requestBody.content["application/json"].schema).toBeTypeOf("object");
    }
    const create = r.json.paths["/workspaces/{ws}/designs"].post;
    expect(create.requestBody.content["application/json"].schema.required).toEqual(expect.arrayContaining(["name", "familyId"]));
    expect(Object.keys(create.responses)).toEqual(expect.arrayContaining(["201", "400", "401", "403", "404", "413", "415"]));
  });
});
