/**
 * `npm run bench:load`: load on a started server (`npm start`, or
 * FANBOUND_BASE_URL with DATABASE_URL for its database), printing one table:
 *
 * - compile load: 50 clients, each its own user, compiling the demo designs on
 *   the built-in families and forms for 60 s — targets: no failed request,
 *   p95 at most 1 s;
 * - mixed load: 50 clients reading designs and revisions and writing drafts,
 *   for 60 s — target p95 at most 300 ms;
 * - the server's memory (resident set of its process, worker threads
 *   included) before, at the peak and 30 s after — target under 400 MiB after.
 *
 * The clients are bench users in a workspace of their own ("load-bench"),
 * made directly in the database with API tokens, so the demo workspace is
 * left as it is. A request refused by a rate limit (429) is counted apart
 * from failures (errors, 5xx, time-outs of 30 s).
 */
import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import { prepareClients, type Client } from "./clients";

const BASE = process.env.FANBOUND_BASE_URL ?? "http://127.0.0.1:3000";
const CLIENTS = Number(process.env.FANBOUND_LOAD_CLIENTS ?? 50);
const SECONDS = Number(process.env.FANBOUND_LOAD_SECONDS ?? 60);
const FAMILIES = ["ttl-std-5v", "ttl-ls-5v", "cmos-hc-5v", "cmos-hct-5v", "lvcmos-3v3"];
const FORMS = ["and-or", "nand", "nor", "or-and", "mixed"];

interface Sample {
  ms: number;
  outcome: "ok" | "failed" | "limited";
}

async function request(token: string, method: string, url: string, body?: unknown): Promise<{ sample: Sample; json: unknown }> {
  const t = performance.now();
  try {
    const res = await fetch(`${BASE}${url}`, {
      method,
      headers: { authorization: `Bearer ${token}`, ...(body === undefined ? {} : { "content-type": "application/json" }) },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(30_000),
    });
    const json: unknown = await res.json().catch(() => null);
    const ms = performance.now() - t;
    // A 409 on a draft is the version check doing its job; a 422 a design the family cannot build — answers, not failures.
    const outcome = res.status === 429 ? "limited" : res.status >= 500 ? "failed" : "ok";
    return { sample: { ms, outcome }, json };
  } catch {
    return { sample: { ms: performance.now() - t, outcome: "failed" }, json: null };
  }
}

async function run(clients: Client[], seconds: number, step: (c: Client, i: number) => Promise<Sample[]>): Promise<Sample[]> {
  const until = Date.now() + seconds * 1000;
  const samples: Sample[] = [];
  await Promise.all(clients.map(async (c, k) => {
    for (let i = k; Date.now() < until; i += clients.length) samples.push(...(await step(c, i)));
  }));
  return samples;
}

const sources = readdirSync("lib/lang/examples").filter((f) => f.endsWith(".fnb")).sort().map((f) => readFileSync(path.join("lib/lang/examples", f), "utf8"));

/** One compile of a demo design on a family and form chosen by the step number. */
const compileStep = async (c: Client, i: number) => {
  const body = {
    source: sources[i % sources.length],
    familyKey: FAMILIES[Math.floor(i / sources.length) % FAMILIES.length],
    workspace: "load-bench",
    settings: { form: FORMS[Math.floor(i / (sources.length * FAMILIES.length)) % FORMS.length] },
  };
  return [(await request(c.token, "POST", "/api/v1/compile", body)).sample];
};

/** Reads of the list, the design and its revisions, and a draft write, in turn. */
const mixedStep = async (c: Client, i: number) => {
  const ws = "/api/v1/workspaces/load-bench";
  switch (i % 4) {
    case 0:
      return [(await request(c.token, "GET", `${ws}/designs?limit=50`)).sample];
    case 1:
      return [(await request(c.token, "GET", `${ws}/designs/${c.designId}/revisions`)).sample];
    case 2:
      return [(await request(c.token, "GET", `${ws}/designs/${c.designId}`)).sample];
    default: {
      const got = await request(c.token, "GET", `${ws}/designs/${c.designId}`);
      const d = (got.json as { design?: { draftSource: string; draftVersion: number; family: { id: string } } } | null)?.design;
      if (!d) return [got.sample];
      const text = d.draftSource.replace(/\n\/\/ load \d+\n?$/, "\n") + `// load ${i}\n`;
      const put = await request(c.token, "PUT", `${ws}/designs/${c.designId}/draft`, { source: text, familyId: d.family.id, settings: {}, baseVersion: d.draftVersion });
      return [got.sample, put.sample];
    }
  }
};

function serverPid(): number | null {
  try {
    return Number(readFileSync(".data/web.pid", "utf8")) || null;
  } catch {
    return null;
  }
}

function rssMiB(pid: number | null): number | null {
  if (!pid) return null;
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return m ? Number(m[1]) / 1024 : null;
  } catch {
    return null;
  }
}

function summary(name: string, samples: Sample[], target: string, met: (p95: number, failed: number) => boolean) {
  const ms = samples.filter((s) => s.outcome === "ok").map((s) => s.ms).sort((a, b) => a - b);
  const q = (f: number) => ms[Math.min(ms.length - 1, Math.ceil(f * ms.length) - 1)] ?? NaN;
  const failed = samples.filter((s) => s.outcome === "failed").length;
  const limited = samples.filter((s) => s.outcome === "limited").length;
  const cells = [name, String(CLIENTS), String(SECONDS), String(samples.length), (samples.length / SECONDS).toFixed(1),
    q(0.5).toFixed(0), q(0.95).toFixed(0), (ms.at(-1) ?? NaN).toFixed(0), String(failed), String(limited), target, met(q(0.95), failed) ? "yes" : "NO"];
  const widths = [9, 8, 8, 9, 7, 8, 8, 8, 7, 8, 28, 4];
  console.log(cells.map((c, i) => (i === 0 || i === 10 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join(" "));
}

async function main() {
  const clients = await prepareClients(CLIENTS);
  const pid = serverPid();
  const sampler: number[] = [];
  const before = rssMiB(pid);
  const timer = setInterval(() => {
    const r = rssMiB(pid);
    if (r) sampler.push(r);
  }, 500);
  console.log(`\nload against ${BASE} (server pid ${pid ?? "unknown: memory not measured"})\n`);
  console.log(["run".padEnd(9), "clients".padStart(8), "seconds".padStart(8), "requests".padStart(9), "req/s".padStart(7), "p50 ms".padStart(8),
    "p95 ms".padStart(8), "max ms".padStart(8), "failed".padStart(7), "limited".padStart(8), " target".padEnd(28), " met"].join(" "));
  const compile = await run(clients, SECONDS, compileStep);
  summary("compile", compile, " p95 ≤ 1000 ms, none failed", (p95, failed) => p95 <= 1000 && failed === 0);
  const mixed = await run(clients, SECONDS, mixedStep);
  summary("mixed", mixed, " p95 ≤ 300 ms, none failed", (p95, failed) => p95 <= 300 && failed === 0);
  await new Promise((r) => setTimeout(r, 30_000));
  clearInterval(timer);
  const after = rssMiB(pid);
  if (pid) {
    const peak = Math.max(...sampler);
    console.log(`\nserver memory (resident, worker threads included): before ${before?.toFixed(0)} MiB, peak ${peak.toFixed(0)} MiB, 30 s after the load ${after?.toFixed(0)} MiB (target under 400 MiB after): met ${after !== null && after < 400 ? "yes" : "NO"}`);
  }
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  console.error(`(is the app served at ${BASE}? start it with npm start)`);
  process.exitCode = 1;
});
