/**
 * Designs wider than the in-thread limit minimize on a worker thread behind
 * POST /api/v1/compile, and a client that cancels stops the run.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as compile } from "@/app/api/v1/compile/route";
import { runsInThread, WORKER_SLOTS } from "@/lib/api/compile";
import { compileSource } from "@/lib/lang";
import { BASE, builtinFamily, makeUser, type TestUser } from "./helpers";
import { db } from "@/lib/db/connection";

// Four products over disjoint inputs: each is a prime that alone covers its own
// minterms, so all four are essential and the cover is minimum (Boolean algebra;
// common practice, no source). 12 inputs, above the in-thread limit.
const WIDE = `// Ferrow Lock & Weir: four sluices, each opens on its own three conditions
inputs a1, a2, a3, b1, b2, b3, c1, c2, c3, d1, d2, d3
outputs open_any
open_any = a1 * a2 * a3 + b1 * b2 * b3 + c1 * c2 * c3 + d1 * d2 * d3
`;

function request(token: string, body: unknown, signal?: AbortSignal) {
  return new Request(new URL("/api/v1/compile", BASE), {
    method: "POST",
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify(body),
    ...(signal ? { signal } : {}),
  });
}

describe("compile on a worker thread", () => {
  let user: TestUser;
  let familyKey: string;
  beforeAll(async () => {
    user = await makeUser("worker");
    familyKey = (await builtinFamily("cmos-hc-5v")).key;
  });
  afterAll(async () => {
    await db().models.User.destroy({ where: { id: user.id } });
  });

  it("returns the minimum cover of a design wider than the in-thread limit", async () => {
    expect(runsInThread(compileSource(WIDE).spec!)).toBe(false);
    const res = await compile(request(user.token, { source: WIDE, familyKey, settings: {} }));
    expect(res.status).toBe(200);
    const body = await res.json();
    const out = body.result.covers.outputs[0];
    expect(out.products).toBe(4);
    expect(out.literals).toBe(12);
    expect(body.result.covers.exact).toBe(true);
    expect(body.result.stats.verified).toBe(true);
  });

  it("queues more compilations than there are worker slots and answers each", async () => {
    const n = WORKER_SLOTS + 2;
    const all = await Promise.all(
      Array.from({ length: n }, () => compile(request(user.token, { source: WIDE, familyKey, settings: {} }))),
    );
    for (const res of all) {
      expect(res.status).toBe(200);
      expect((await res.json()).result.covers.outputs[0].products).toBe(4);
    }
  });

  it("stops when the client cancels, with a 422 that names the cancellation", async () => {
    const controller = new AbortController();
    const pending = compile(request(user.token, { source: WIDE, familyKey, settings: {} }, controller.signal));
    controller.abort();
    const res = await pending;
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("compile_limit");
    expect(body.error.details.limit).toBe("aborted");
  });
});
