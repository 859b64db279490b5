/**
 * Compiles run on the server's pool of worker threads, off the request
 * thread: a light request answers while a heavy compile runs, a run over its
 * budget stops with a limit that says what to change, a client that cancels
 * stops its run, one caller's burst waits its turn, and an identical compile
 * in the same workspace is answered from the stored result.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { POST as compileRoute } from "@/app/api/v1/compile/route";
import { GET as meRoute } from "@/app/api/v1/me/route";
import { compileOnServer, compilePool } from "@/lib/runtime/compile";
import { AppError } from "@/lib/api/errors";
import { BUILT_IN_FAMILIES } from "@/lib/families";
import { paritySource } from "@/lib/bench/sources";
import { BASE, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

// Four products over disjoint inputs: each is a prime that alone covers its own
// minterms, so all four are essential and the cover is minimum (Boolean algebra;
// common practice, no source).
const wide = (name = "open_any") => `// Ferrow Lock & Weir: four sluices, each opens on its own three conditions
inputs a1, a2, a3, b1, b2, b3, c1, c2, c3, d1, d2, d3
outputs ${name}
${name} = a1 * a2 * a3 + b1 * b2 * b3 + c1 * c2 * c3 + d1 * d2 * d3
`;
// Parity of 14 inputs: 8,192 products of 14 literals to map and verify — seconds of work (common practice, no source).
const HEAVY = paritySource(14);
const ttl = BUILT_IN_FAMILIES.find((f) => f.id === "ttl-std-5v")!;

function request(token: string, body: unknown, signal?: AbortSignal) {
  return new Request(new URL("/api/v1/compile", BASE), {
    method: "POST",
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify(body),
    ...(signal ? { signal } : {}),
  });
}

let user: TestUser;
let other: TestUser;
let ws: { id: string; slug: string };

beforeAll(async () => {
  user = await makeUser("pool");
  other = await makeUser("pool-other");
  ws = await makeWorkspace("pool", user);
  await resetLimits();
});

describe("compiles on the worker pool", () => {
  it("returns the verified minimum cover, and the same answer from the store the second time", async () => {
    const body = { source: wide(`open_${tag()}`), familyKey: "cmos-hc-5v", workspace: ws.slug, settings: {} };
    const first = await (await compileRoute(request(user.token, body))).json();
    expect(first.cached).toBe(false);
    const out = first.result.covers.outputs[0];
    expect(out.products).toBe(4);
    expect(out.literals).toBe(12);
    expect(first.result.covers.exact).toBe(true);
    expect(first.result.stats.verified).toBe(true);
    // A comment changes nothing the pipeline reads: the stored result answers.
    const again = await (await compileRoute(request(user.token, { ...body, source: `// again\n${body.source}` }))).json();
    expect(again.cached).toBe(true);
    expect(again.result).toEqual(first.result);
  });

  it("answers a light request while a heavy compile runs", async () => {
    const order: string[] = [];
    const heavy = compileRoute(request(user.token, { source: HEAVY, familyKey: "ttl-std-5v", settings: { heuristic: true } }))
      .then((r) => { order.push(`heavy ${r.status}`); });
    await new Promise((r) => setTimeout(r, 300));
    const me = await meRoute(new Request(new URL("/api/v1/me", BASE), { headers: { authorization: `Bearer ${other.token}` } }));
    order.push(`me ${me.status}`);
    const light = await compileRoute(request(other.token, { source: wide(), familyKey: "cmos-hc-5v", settings: {} }));
    order.push(`light ${light.status}`);
    await heavy;
    expect(order).toEqual(["me 200", "light 200", expect.stringMatching(/^heavy (200|422)$/)]);
  });

  it("stops a run over its budget with a limit that says what was reached and what to change", async () => {
    const err = await compileOnServer({ source: HEAVY, family: ttl, settings: { heuristic: true }, userId: user.id, budgetMs: 400 })
      .catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).code).toBe("compile_limit");
    expect((err as AppError).details).toMatchObject({ limit: "limit", what: "time limit of 0.4 s", hint: expect.stringMatching(/job|Heuristic/) });
  });

  it("stops when the client cancels, with a 422 that says it was stopped", async () => {
    const controller = new AbortController();
    // A clock no other test uses: the heavy compile above may have finished within its budget, and its kept
    // result must not answer this one before the cancel arrives.
    const settings = { heuristic: true, clockMHz: 12.5 };
    const pending = compileRoute(request(user.token, { source: HEAVY, familyKey: "ttl-std-5v", settings }, controller.signal));
    setTimeout(() => controller.abort(), 200);
    const res = await pending;
    expect(res.status).toBe(422);
    expect((await res.json()).error.details.limit).toBe("cancelled");
  });

  it("queues one caller's burst and answers each, while the pool keeps a thread for others", async () => {
    const pool = compilePool();
    const n = pool.queue.slots + 2;
    const all = await Promise.all(
      Array.from({ length: n }, (_, i) => compileRoute(request(user.token, { source: wide(`burst_${i}_${tag()}`), familyKey: "cmos-hc-5v", settings: {} }))),
    );
    for (const res of all) {
      expect(res.status).toBe(200);
      expect((await res.json()).result.covers.outputs[0].products).toBe(4);
    }
    expect(pool.queue.perCaller).toBeLessThan(pool.queue.slots);
  });
});
