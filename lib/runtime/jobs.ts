import "server-only";
/**
 * Long compiles as jobs on PostgreSQL. The web server files a job (a row in
 * compile_jobs and a message on pg-boss's "compile" queue); any number of
 * worker processes (`npm run worker`, on any machine that reaches the
 * database) take jobs one at a time, report where they stand, keep a
 * heartbeat, and store the result under the job's key. A job whose worker
 * stops answering is put back on the queue by any other worker.
 */
import { hostname } from "node:os";
import { QueryTypes } from "sequelize";
import PgBoss from "pg-boss";
import { db } from "../db/connection";
import { keepResult, MAX_CACHED_BYTES } from "../data/compile-cache";
import type { PipelineError, Progress, StageJob } from "../pipeline/stages";
import type { CompilePool } from "./pool";

export const QUEUE = "compile";
/** A job may run this long: 4 hours. */
export const JOB_BUDGET_MS = 4 * 3600_000;
/** Workers say they are alive this often, ms. */
export const HEARTBEAT_MS = 2_000;
/** A running job whose worker has been silent this long is handed to another: 15 s. */
export const STALE_AFTER_S = 15;
/** A job is tried on at most this many workers before it is given up. */
export const MAX_ATTEMPTS = 3;
const MAX_CACHED_MIB = MAX_CACHED_BYTES / 1048576;

const g = globalThis as unknown as { fanboundBoss?: Promise<PgBoss> };

/**
 * This process's pg-boss client (the schema and the queue come from the
 * migrations). Workers pass `supervise` so that one of them archives and
 * expires old queue entries; the web server only sends.
 */
export function boss(supervise = false): Promise<PgBoss> {
  g.fanboundBoss ??= (async () => {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error("DATABASE_URL is not set: start the app with `npm start`");
    const b = new PgBoss({ connectionString: url, schema: "pgboss", migrate: false, schedule: false, supervise, max: 2 });
    b.on("error", (e: unknown) => console.error("job queue:", e));
    await b.start();
    return b;
  })();
  return g.fanboundBoss;
}

/** Puts a job (its compile_jobs row exists already) on the queue. */
export async function enqueue(jobId: string): Promise<void> {
  await (await boss()).send(QUEUE, { jobId }, { expireInSeconds: JOB_BUDGET_MS / 1000 + 600 });
}

interface JobRow {
  id: string;
  workspace_id: string;
  user_id: string;
  key: string;
  input: StageJob;
  attempt: number;
}

/** The worker's side: one job, claimed, run, reported and stored. Returns what became of it. */
export async function runJob(jobId: string, pool: CompilePool, worker = workerName()): Promise<"done" | "failed" | "cancelled" | "skipped"> {
  const { sequelize } = db();
  const claimed = await sequelize.query<JobRow>(
    `UPDATE compile_jobs SET status = 'running', worker = $2, attempt = attempt + 1, heartbeat_at = now(), stage = 'minimize', updated_at = now()
     WHERE id = $1 AND status = 'queued' AND NOT cancel_requested
     RETURNING id, workspace_id, user_id, key, input, attempt`,
    { bind: [jobId, worker], type: QueryTypes.SELECT },
  );
  const job = claimed[0];
  if (!job) return "skipped";
  const mine = "id = $1 AND worker = $2 AND attempt = $3";
  const ctl = new AbortController();
  const beat = setInterval(() => {
    void sequelize.query<{ cancel_requested: boolean }>(
      `UPDATE compile_jobs SET heartbeat_at = now() WHERE ${mine} AND status = 'running' RETURNING cancel_requested`,
      { bind: [job.id, worker, job.attempt], type: QueryTypes.SELECT },
    ).then((rows) => {
      // Cancelled by the designer, or handed to another worker while this one was silent.
      if (!rows[0] || rows[0].cancel_requested) ctl.abort(new Error("cancelled"));
    }, () => {});
  }, HEARTBEAT_MS);
  let lastReport = 0;
  const onProgress = (p: Progress) => {
    const now = Date.now();
    if (now - lastReport < 500 && p.stage === "minimize") return;
    lastReport = now;
    void sequelize.query(
      `UPDATE compile_jobs SET stage = $4, cost = $5, lower_bound = $6, primes = $7, updated_at = now() WHERE ${mine}`,
      { bind: [job.id, worker, job.attempt, p.stage, p.cost ?? null, p.lowerBound ?? null, p.primes ?? null], type: QueryTypes.UPDATE },
    ).catch(() => {});
  };
  try {
    const out = await pool.executor(`job:${job.user_id}`, JOB_BUDGET_MS)(job.input, { signal: ctl.signal, onProgress });
    if (out.ok) {
      const keep = await keepResult(job.key, `ws:${job.workspace_id}`, out.result);
      const { cost, lowerBound, primes } = out.result.covers;
      if (!keep.kept) {
        // A job is read back from the kept results; one too large to keep (or to show) is no result for the designer.
        const gates = out.result.stats.gates;
        await finish(job, worker, "failed", {
          code: "limit",
          what: `size of a kept result (${MAX_CACHED_MIB} MiB)`,
          message: `The compile ran to the end, but its result (${gates.toLocaleString("en")} gates, ${(keep.bytes / 1048576).toFixed(0)} MiB) is larger than the ${MAX_CACHED_MIB} MiB a kept result may hold, so it cannot be shown.`,
          hint: "Split the design into smaller blocks, or write wide exclusive-ors and comparisons as let steps and keep the factored structure.",
        }, { cost, lowerBound, primes: primes >= 0 ? primes : null });
        return "failed";
      }
      await finish(job, worker, "done", null, { cost, lowerBound, primes: primes >= 0 ? primes : null });
      return "done";
    }
    const status = out.error.code === "cancelled" ? "cancelled" : "failed";
    await finish(job, worker, status, out.error);
    return status;
  } catch (e) {
    await finish(job, worker, "failed", { code: "limit", message: `The worker could not run this compile: ${(e as Error).message}` });
    return "failed";
  } finally {
    clearInterval(beat);
  }
}

async function finish(job: JobRow, worker: string, status: string, error: PipelineError | null, figures?: { cost: number; lowerBound: number; primes: number | null }) {
  await db().sequelize.query(
    `UPDATE compile_jobs SET status = $4, error = $5::jsonb, finished_at = now(), updated_at = now(),
            cost = COALESCE($6, cost), lower_bound = COALESCE($7, lower_bound), primes = COALESCE($8, primes)
     WHERE id = $1 AND worker = $2 AND attempt = $3`,
    {
      bind: [job.id, worker, job.attempt, status, error ? JSON.stringify(error) : null, figures?.cost ?? null, figures?.lowerBound ?? null, figures?.primes ?? null],
      type: QueryTypes.UPDATE,
    },
  );
}

/**
 * Hands running jobs whose worker has gone silent to the queue again (or
 * gives them up after MAX_ATTEMPTS). Any worker may call it; returns the ids
 * put back.
 */
export async function reapStale(): Promise<string[]> {
  const { sequelize } = db();
  await sequelize.query(
    `UPDATE compile_jobs SET status = 'failed', finished_at = now(), updated_at = now(),
            error = '{"code": "limit", "message": "The workers that took this compile stopped three times; it is not tried again. Split the design, or tick Heuristic only."}'::jsonb
     WHERE status = 'running' AND heartbeat_at < now() - make_interval(secs => $1) AND attempt >= $2`,
    { bind: [STALE_AFTER_S, MAX_ATTEMPTS], type: QueryTypes.UPDATE },
  );
  const rows = await sequelize.query<{ id: string }>(
    `UPDATE compile_jobs SET status = 'queued', worker = NULL, updated_at = now()
     WHERE status = 'running' AND heartbeat_at < now() - make_interval(secs => $1) AND attempt < $2 AND NOT cancel_requested
     RETURNING id`,
    { bind: [STALE_AFTER_S, MAX_ATTEMPTS], type: QueryTypes.SELECT },
  );
  for (const r of rows) await enqueue(r.id);
  return rows.map((r) => r.id);
}

export function workerName(): string {
  return `${hostname()}:${process.pid}`;
}
