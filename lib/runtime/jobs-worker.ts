/**
 * `npm run worker`: a job worker. Takes compile jobs from PostgreSQL one at a
 * time and runs them on a worker thread (so its heartbeat keeps beating while
 * the compile runs), and now and then hands the jobs of silent workers back to
 * the queue. Start as many as you like, on any machine that reaches the
 * database (DATABASE_URL); `npm start` starts one beside the server. Stops
 * cleanly on SIGTERM or SIGINT: a job under way goes back to the queue.
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { boss, QUEUE, reapStale, runJob, workerName } from "./jobs";
import { CompilePool } from "./pool";

const worker = workerName();
// One thread for the job, one spare: the pool keeps a thread for another caller.
const pool = new CompilePool({ threads: 2, perCaller: 1, queuePerCaller: 1, memoryMb: Number(process.env.FANBOUND_JOB_MEMORY_MB ?? 4096) });

async function main() {
  const b = await boss(true);
  let busy: string | null = null;
  await b.work<{ jobId: string }>(QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    if (!job) return;
    busy = job.data.jobId;
    try {
      const outcome = await runJob(job.data.jobId, pool, worker);
      console.log(`[worker ${worker}] job ${job.data.jobId}: ${outcome}`);
    } finally {
      busy = null;
    }
  });
  const reaper = setInterval(() => {
    reapStale().then((ids) => ids.length && console.log(`[worker ${worker}] back on the queue: ${ids.join(", ")}`), (e: unknown) => console.error(e));
  }, 5_000);
  console.log(`[worker ${worker}] taking compile jobs`);

  const stop = async () => {
    clearInterval(reaper);
    if (busy) {
      // Hand the job under way back, so another worker takes it at once.
      await db().sequelize.query("UPDATE compile_jobs SET status = 'queued', worker = NULL WHERE id = $1 AND worker = $2 AND status = 'running'", {
        bind: [busy, worker], type: QueryTypes.UPDATE,
      });
      await b.send(QUEUE, { jobId: busy });
    }
    await b.stop({ graceful: false, wait: false });
    await pool.close();
    await db().sequelize.close();
    process.exit(0);
  };
  process.once("SIGTERM", () => void stop());
  process.once("SIGINT", () => void stop());
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
