/**
 * `npm run bench:platform` (and the end of `npm run bench`): the figures of the platform around the pipeline,
 * printed as one table against their targets.
 *
 * - CLI start: `check` of a small file and `minimize` of a demo design, run
 *   as a script would (node, the built CLI), median of 7 — targets 0.3 s and 0.5 s;
 * - dispatch to a warm worker of the compile pool: a trivial job's round trip
 *   minus its own run time on this thread, median of 50 — target 10 ms;
 *
 * and, against a started server (`npm start`; FANBOUND_BASE_URL), when one
 * answers:
 * - a compile answered from the kept results: the same 16-input design
 *   compiled twice, the second answer's time;
 * - an 18-input job end to end (a 9-bit magnitude comparator): filed, taken
 *   by a job worker, run to the end, its result read back.
 */
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { CompilePool } from "../runtime/pool";
import { prepare, runStages } from "../pipeline/index";
import { BUILT_IN_FAMILIES } from "../families/index";
import { comparatorSource } from "./sources";
import { prepareClients } from "./clients";

const BASE = process.env.FANBOUND_BASE_URL ?? "http://127.0.0.1:3000";
const rows: Array<[string, string, string, boolean | null]> = [];
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

function cliMs(args: string[]): number {
  const t = performance.now();
  execFileSync(process.execPath, ["lib/cli/run.mjs", ...args], { stdio: "ignore" });
  return performance.now() - t;
}

/** The platform table; `npm run bench` prints it after the minimizer's. */
export async function platformSection(): Promise<void> {
  // The CLI's bundle is built (and up to date) before anything is timed.
  cliMs(["check", "lib/lang/examples/level-display.fnb"]);
  const check = median(Array.from({ length: 7 }, () => cliMs(["check", "lib/lang/examples/level-display.fnb"])));
  rows.push(["CLI check of a small file, median of 7", `${check.toFixed(0)} ms`, "≤ 300 ms", check <= 300]);
  const min = median(Array.from({ length: 7 }, () => cliMs(["minimize", "lib/lang/examples/chamber-interlock.fnb"])));
  rows.push(["CLI minimize of the chamber interlock, median of 7", `${min.toFixed(0)} ms`, "≤ 500 ms", min <= 500]);

  const family = BUILT_IN_FAMILIES.find((f) => f.id === "ttl-std-5v")!;
  const job = prepare({ source: "inputs a, b\noutputs f\nf = a * b\n", family }).job!;
  const pool = new CompilePool({ threads: 2 });
  const exec = pool.executor("bench", 60_000);
  for (let i = 0; i < 10; i++) await exec(job, {});
  const trips: number[] = [];
  for (let i = 0; i < 50; i++) {
    const t = performance.now();
    await exec(job, {});
    trips.push(performance.now() - t);
  }
  const own = median(Array.from({ length: 50 }, () => {
    const t = performance.now();
    runStages(job);
    return performance.now() - t;
  }));
  const dispatch = Math.max(0, median(trips) - own);
  rows.push(["dispatch to a warm pool worker (round trip less the run), median of 50", `${dispatch.toFixed(1)} ms`, "≤ 10 ms", dispatch <= 10]);
  await pool.close();

  const up = await fetch(`${BASE}/api/v1/openapi.json`).then((r) => r.ok, () => false);
  if (!up) {
    rows.push([`server figures: no server answers at ${BASE} (start it with npm start)`, "—", "", null]);
  } else {
    const [client] = await prepareClients(1);
    const auth = { authorization: `Bearer ${client!.token}`, "content-type": "application/json" };
    const source = `${comparatorSource(8)}// platform bench ${Date.now()}\n`;
    const body = JSON.stringify({ source, familyKey: "cmos-hc-5v", workspace: "load-bench", settings: {} });
    let t = performance.now();
    const first = await fetch(`${BASE}/api/v1/compile`, { method: "POST", headers: auth, body }).then((r) => r.json() as Promise<{ cached?: boolean }>);
    const missMs = performance.now() - t;
    t = performance.now();
    const second = await fetch(`${BASE}/api/v1/compile`, { method: "POST", headers: auth, body }).then((r) => r.json() as Promise<{ cached?: boolean }>);
    const hitMs = performance.now() - t;
    rows.push([`compile of a 16-input comparator answered from the kept results (first run ${missMs.toFixed(0)} ms${first.cached ? ", kept already" : ""})`,
      `${hitMs.toFixed(0)} ms`, "kept result", second.cached === true]);

    // 18 inputs: a 9-bit magnitude comparator, run to the end as a job (filed, taken by a job worker, stored, read back).
    const src18 = `${comparatorSource(9)}// platform bench job ${Date.now()}\n`;
    const fam = (await fetch(`${BASE}/api/v1/workspaces/load-bench/families`, { headers: auth }).then((r) => r.json())) as { items: Array<{ id: string; key: string }> };
    t = performance.now();
    const filed = (await fetch(`${BASE}/api/v1/workspaces/load-bench/jobs`, {
      method: "POST", headers: auth, body: JSON.stringify({ source: src18, familyId: fam.items.find((f) => f.key === "cmos-hc-5v")!.id, settings: {} }),
    }).then((r) => r.json())) as { job: { id: string } };
    let status = "queued";
    let gates = 0;
    while (performance.now() - t < 30 * 60_000) {
      await new Promise((r) => setTimeout(r, 500));
      const j = (await fetch(`${BASE}/api/v1/workspaces/load-bench/jobs/${filed.job.id}`, { headers: auth }).then((r) => r.json())) as { job: { status: string; result: { stats: { gates: number } } | null } };
      status = j.job.status;
      if (!["queued", "running"].includes(status)) {
        gates = j.job.result?.stats.gates ?? 0;
        break;
      }
    }
    const jobMs = performance.now() - t;
    rows.push([`18-input job end to end (9-bit comparator, ${gates.toLocaleString("en")} gates), ${status}`, `${(jobMs / 1000).toFixed(1)} s`, "done", status === "done"]);
  }

  const w = Math.max(...rows.map((r) => r[0].length));
  console.log(`\nplatform figures (${new Date().toISOString().slice(0, 16)}, ${readFileSync("/proc/loadavg", "utf8").split(" ")[0]} load)\n`);
  for (const [what, value, target, met] of rows) {
    console.log(`${what.padEnd(w)}  ${value.padStart(9)}  ${target.padEnd(12)}  ${met === null ? "" : met ? "met" : "NOT MET"}`);
  }
}

// Run alone as `npm run bench:platform`.
if (process.argv[1]?.endsWith("platform.ts")) {
  platformSection().catch((e: unknown) => {
    console.error(e instanceof Error ? e.stack : e);
    process.exitCode = 1;
  });
}
