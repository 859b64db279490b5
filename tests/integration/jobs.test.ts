/**
 * Compiles run to the end as jobs on PostgreSQL: worker processes take them,
 * report progress and store the result; a job whose worker is killed is taken
 * up by another; a cancelled job stops; a job whose exact result is kept is
 * done at once. The workers here are real processes of the built worker.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as jobsRoute from "@/app/api/v1/workspaces/[ws]/jobs/route";
import * as jobRoute from "@/app/api/v1/workspaces/[ws]/jobs/[jobId]/route";
import { resetLimits } from "@/lib/api/rate-limit";
import { compileNow } from "@/lib/pipeline";
import { BUILT_IN_FAMILIES } from "@/lib/families";
import { paritySource } from "@/lib/bench/sources";
import { randomCase } from "@/lib/bench/cases";
import type { FunctionSpec } from "@/lib/logic";
import { QueryTypes } from "sequelize";
import { keepResult, MAX_CACHED_BYTES } from "@/lib/data/compile-cache";
import type { CompileResult } from "@/lib/pipeline";
import { builtinFamily, call, makeUser, makeWorkspace, tag, type TestUser } from "./helpers";

const workers: ChildProcess[] = [];
function startWorker(): ChildProcess {
  const w = spawn(process.execPath, [".build/jobs-worker.mjs"], { env: process.env, stdio: ["ignore", "ignore", "inherit"] });
  workers.push(w);
  return w;
}

/**
 * Prime implicants of a one-output function's ON ∪ DC set, from the definition (common practice, no source):
 * every cube of the 3^n, written in ternary (digit i: input i at 0, 1, or free), is an implicant when both its
 * halves on its first free input are; a prime is an implicant that stays one with no fixed input freed.
 */
function primeCount(spec: FunctionSpec): number {
  const n = spec.inputs.length;
  const care = new Uint8Array(2 ** n);
  for (const c of [...spec.outputs[0]!.on, ...spec.outputs[0]!.dc]) care[c.value] = 1;
  const p3 = Array.from({ length: n + 1 }, (_, i) => 3 ** i);
  const implicant = new Uint8Array(p3[n]!);
  for (let t = 0; t < p3[n]!; t++) {
    let m = 0;
    let free = -1;
    for (let i = 0, x = t; i < n; i++, x = Math.floor(x / 3)) {
      const d = x % 3;
      if (d === 2) free = free < 0 ? i : free;
      else if (d === 1) m |= 1 << (n - 1 - i);
    }
    implicant[t] = free < 0 ? care[m]! : implicant[t - 2 * p3[free]!]! & implicant[t - p3[free]!]!;
  }
  let count = 0;
  for (let t = 0; t < p3[n]!; t++) {
    if (!implicant[t]) continue;
    let prime = true;
    for (let i = 0, x = t; i < n && prime; i++, x = Math.floor(x / 3)) {
      const d = x % 3;
      if (d !== 2 && implicant[t + (2 - d) * p3[i]!]) prime = false;
    }
    if (prime) count++;
  }
  return count;
}

let owner: TestUser;
let ws: { id: string; slug: string };
let familyId: string;

beforeAll(async () => {
  owner = await makeUser("jobs");
  ws = await makeWorkspace("jobs", owner);
  familyId = (await builtinFamily("ttl-std-5v")).id;
  await resetLimits();
});

afterAll(() => {
  for (const w of workers) w.kill("SIGKILL");
});

const file = (source: string, settings: Record<string, unknown> = {}) =>
  call(jobsRoute.POST, "POST", "/jobs", { token: owner.token, params: { ws: ws.slug }, body: { source, familyId, settings } });
const read = (id: string) => call(jobRoute.GET, "GET", "/job", { token: owner.token, params: { ws: ws.slug, jobId: id } });

async function until(id: string, ok: (job: Record<string, unknown>) => boolean, seconds = 120) {
  for (let i = 0; i < seconds * 5; i++) {
    const j = (await read(id)).json.job as Record<string, unknown>;
    if (ok(j)) return j;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`job ${id} did not reach the state in ${seconds} s`);
}

describe("compile jobs", () => {
  it("are taken by a worker, which stores the same result the pipeline gives in-thread", async () => {
    startWorker();
    // Two-of-three vote under a fresh name, so no earlier run has kept its result.
    const out = `vote_${tag()}`;
    const text = `inputs a, b, c\noutputs ${out}\n${out} = a * b + a * c + b * c\n`;
    const r = await file(text);
    expect(r.status).toBe(202);
    const done = await until(r.json.job.id, (j) => j.status === "done");
    const want = compileNow({ source: text, family: BUILT_IN_FAMILIES.find((f) => f.id === "ttl-std-5v")! }).result!;
    expect((done.result as { stats: unknown }).stats).toEqual(want.stats);
    expect((done.result as { netlist: { gates: unknown[] } }).netlist.gates).toEqual(want.document.gates);
    expect(done.cost).toBe(want.covers.cost);
    // The same compile again: its exact result is kept, so the job is done without a worker.
    const again = await file(text);
    expect(again.json.job.status).toBe("done");
    expect(again.json.job.result.stats).toEqual(want.stats);
  });

  it("says so when a done job's result is no longer kept, and the store refuses a result over its size limit with its size", async () => {
    const out = `vote_${tag()}`;
    const r = await file(`inputs a, b, c\noutputs ${out}\n${out} = a * b + a * c + b * c\n`);
    const done = await until(r.json.job.id, (j) => j.status === "done");
    expect(done.result).not.toBeNull();
    const { db } = await import("@/lib/db/connection");
    const row = (await db().sequelize.query<{ key: string }>("SELECT key FROM compile_jobs WHERE id = $1", { bind: [r.json.job.id], type: QueryTypes.SELECT }))[0]!;
    await db().sequelize.query("DELETE FROM compile_results WHERE key = $1", { bind: [row.key] });
    const gone = (await read(r.json.job.id)).json.job as { result: unknown; error: { message: string; hint: string } };
    expect(gone.result).toBeNull();
    expect(gone.error.message).toContain("no longer kept");
    expect(gone.error.hint).toContain("Compile the design again");

    // A result one byte of text over the limit is not kept; the store answers its size (the job then fails with it).
    const big = { ...(done.result as object), covers: { exact: false }, stats: { gates: 1 }, warnings: ["x".repeat(MAX_CACHED_BYTES)] };
    const kept = await keepResult(`test-${tag()}`, `ws:${ws.id}`, big as unknown as CompileResult);
    expect(kept.kept).toBe(false);
    expect(kept.bytes).toBeGreaterThan(MAX_CACHED_BYTES);
  });

  it("is taken up by another worker when the one running it is killed", async () => {
    const a = startWorker();
    // 12-input parity: 2,048 products to map and prove — seconds of work (common practice, no source).
    const r = await file(`${paritySource(12)}// ${tag()}\n`, { heuristic: true, fanOut: 9 });
    const running = await until(r.json.job.id, (j) => j.status === "running" || j.status === "done");
    if (running.status === "running") {
      a.kill("SIGKILL");
      for (const w of workers) if (w !== a) w.kill("SIGKILL");
      startWorker();
      const done = await until(r.json.job.id, (j) => j.status === "done" || j.status === "failed", 240);
      expect(done.status).toBe("done");
      expect(done.attempt).toBe(2);
      expect((done.result as { stats: { verified: boolean } }).stats.verified).toBe(true);
    } else {
      throw new Error("the job finished before the worker could be killed; give it more work");
    }
  });

  it("stops when cancelled", async () => {
    startWorker();
    const r = await file(`${paritySource(13)}// ${tag()}\n`, { heuristic: true, fanOut: 8 });
    await until(r.json.job.id, (j) => j.status !== "queued");
    const c = await call(jobRoute.DELETE, "DELETE", "/job", { token: owner.token, params: { ws: ws.slug, jobId: r.json.job.id } });
    expect(c.status).toBe(200);
    const end = await until(r.json.job.id, (j) => j.status !== "running" && j.status !== "queued", 60);
    expect(end.status).toBe("cancelled");
  });

  it("reports the primes, the best cost and the proven bound while it minimizes", async () => {
    startWorker();
    // A random 12-input function (the bench's seed 1): thousands of primes, and a cover search that runs far
    // longer than this test waits; its minimum is not known, so the test stops it once it has reported.
    const { spec } = randomCase(12, 1);
    const idx = (cs: { value: number }[]) => cs.map((c) => c.value).join(", ");
    const o = spec.outputs[0]!;
    const text = `inputs ${spec.inputs.join(", ")}\noutputs f\nf = on(${idx(o.on)}) dc(${idx(o.dc)})\n// ${tag()}\n`;
    const r = await file(text);
    const seen = await until(r.json.job.id, (j) => j.status === "running" && j.primes !== null && j.cost !== null && j.lowerBound !== null);
    // Reference: the test's own count of the primes (every cube of the ON ∪ DC set that no larger one holds).
    expect(seen.primes).toBe(primeCount(spec));
    expect(seen.stage).toBe("minimize");
    expect(seen.lowerBound as number).toBeLessThanOrEqual(seen.cost as number);
    expect(seen.lowerBound as number).toBeGreaterThan(0);
    await call(jobRoute.DELETE, "DELETE", "/job", { token: owner.token, params: { ws: ws.slug, jobId: r.json.job.id } });
    const end = await until(r.json.job.id, (j) => j.status !== "running" && j.status !== "queued", 60);
    expect(end.status).toBe("cancelled");
  });

  it("refuses a source with errors with its diagnostics, filing nothing", async () => {
    const r = await file("inputs a\noutputs f\nf = b\n");
    expect(r.status).toBe(422);
    expect(r.json.error.details.diagnostics.length).toBeGreaterThan(0);
  });
});
