import "server-only";
/**
 * Compile jobs of a workspace: filed by any member who may compile, read by
 * the workspace's members, cancelled by whoever filed them or an owner. The
 * stages run on job workers (lib/runtime/jobs.ts); the result is kept under
 * the job's key with the other compile results of the workspace.
 */
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import { AppError, forbidden, notFound } from "../errors";
import { resultBody, type CompileSettings } from "../runtime/compile";
import { prepare, resolveSettings, type PipelineError } from "../pipeline";
import { CACHE_DAYS, cacheKey, cachedResult } from "./compile-cache";
import { enqueue, JOB_BUDGET_MS } from "../runtime/jobs";
import { iso, requireAccess, type Actor } from "./access";
import { boundaryFamilies, familyOf } from "./families";
import { usableFamily } from "./designs";
import { answersForSource, pinsOf, resolverOf } from "./library-resolve";

export type JobStatus = "queued" | "running" | "done" | "failed" | "cancelled";

export interface JobView {
  id: string;
  status: JobStatus;
  /** The stage under way ("minimize", "map", "factor", "analyse", "export"), once a worker has it. */
  stage: string | null;
  /** Cost of the best cover found so far, and its proven lower bound (the gap closes as the run goes on). */
  cost: number | null;
  lowerBound: number | null;
  /** Prime implicants the minimizer found, once known (none on the heuristic alone). */
  primes: number | null;
  error: PipelineError | null;
  attempt: number;
  designId: string | null;
  createdBy: { id: string; name: string };
  createdAt: string;
  finishedAt: string | null;
  /** The result, once the job is done (the same shape as POST /compile's). */
  result: ReturnType<typeof resultBody> | null;
}

interface Row {
  id: string;
  status: JobStatus;
  stage: string | null;
  cost: number | null;
  lower_bound: number | null;
  primes: number | null;
  error: PipelineError | null;
  attempt: number;
  design_id: string | null;
  user_id: string;
  user_name: string;
  key: string;
  created_at: Date;
  finished_at: Date | null;
}

const SELECT = `SELECT j.id, j.status, j.stage, j.cost, j.lower_bound, j.primes, j.error, j.attempt, j.design_id, j.user_id, u.name AS user_name,
                       j.key, j.created_at, j.finished_at
                FROM compile_jobs j JOIN users u ON u.id = j.user_id`;

async function view(r: Row, withResult: boolean): Promise<JobView> {
  const result = withResult && r.status === "done" ? await cachedResult(r.key) : null;
  // Kept results unused for CACHE_DAYS are dropped; the job then says so instead of being done with nothing to show.
  const gone = withResult && r.status === "done" && !result;
  return {
    id: r.id,
    status: r.status,
    stage: r.stage,
    cost: r.cost,
    lowerBound: r.lower_bound,
    primes: r.primes,
    error: gone
      ? { code: "limit", message: `The result of this compile is no longer kept (results unused for ${CACHE_DAYS} days are dropped).`, hint: "Compile the design again, or file the job again." }
      : r.error,
    attempt: r.attempt,
    designId: r.design_id,
    createdBy: { id: r.user_id, name: r.user_name },
    createdAt: iso(r.created_at)!,
    finishedAt: iso(r.finished_at),
    result: result ? resultBody(result) : null,
  };
}

async function load(workspaceId: string, id: string): Promise<Row> {
  const rows = await db().sequelize.query<Row>(`${SELECT} WHERE j.workspace_id = $1 AND j.id = $2`, { bind: [workspaceId, id], type: QueryTypes.SELECT });
  if (!rows[0]) throw notFound("compile job");
  return rows[0];
}

/**
 * Files a compile to be run to the end by a job worker. A source with errors
 * is refused (422 with its diagnostics); a compile whose exact result is kept
 * already is answered by a job that is done at once.
 */
export async function createJob(p: {
  actor: Actor | null;
  slug: string;
  source: string;
  familyId: string;
  settings: CompileSettings;
  designId?: string;
}): Promise<JobView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
  let current: string | undefined;
  if (p.designId) {
    const d = await db().models.Design.findOne({ where: { id: p.designId, workspaceId: workspace.id } });
    if (!d) throw notFound("design");
    current = d.familyId;
  }
  // A design on an archived family runs on it still; the families at its edges come along, and so do the library blocks its use lines name.
  const family = familyOf(await usableFamily(workspace.id, p.familyId, current));
  const families = await boundaryFamilies(workspace.id, p.settings);
  const loaded = await answersForSource(workspace.id, p.source);
  const { diagnostics, job } = prepare({ source: p.source, family, settings: resolveSettings(p.settings), families, resolve: resolverOf(loaded) });
  if (!job) throw new AppError("compile_errors", "The source has errors; fix them before running it as a job.", { diagnostics });
  job.minimizeMs = Math.round(JOB_BUDGET_MS * 0.9);
  const scope = `ws:${workspace.id}`;
  // The same key as the workbench's compile of this text, so the result it keeps answers that compile.
  const key = cacheKey(scope, job, pinsOf(loaded));
  const kept = await cachedResult(key);
  const settled = kept && (kept.covers.exact || job.settings.heuristic);
  const rows = await db().sequelize.query<{ id: string }>(
    `INSERT INTO compile_jobs (workspace_id, design_id, user_id, key, input, status, stage, cost, lower_bound, primes, finished_at, created_at, updated_at)
     VALUES ($1, $2, $3, $4, $5::jsonb, $6, $7, $8, $9, $10, $11, now(), now()) RETURNING id`,
    {
      bind: [workspace.id, p.designId ?? null, p.actor!.userId, key, JSON.stringify(job), settled ? "done" : "queued",
        settled ? "export" : null, settled ? kept.covers.cost : null, settled ? kept.covers.lowerBound : null,
        settled && kept.covers.primes >= 0 ? kept.covers.primes : null, settled ? new Date() : null],
      type: QueryTypes.SELECT,
    },
  );
  const id = rows[0]!.id;
  if (!settled) await enqueue(id);
  return view(await load(workspace.id, id), true);
}

/** One job, with its result once it is done. */
export async function getJob(p: { actor: Actor | null; slug: string; jobId: string }): Promise<JobView> {
  const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
  return view(await load(workspace.id, p.jobId), true);
}

/** The workspace's latest jobs, newest first (without results); `mine` keeps the caller's own. */
export async function listJobs(p: { actor: Actor | null; slug: string; mine?: boolean; limit?: number }): Promise<JobView[]> {
  const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
  const limit = Math.min(Math.max(p.limit ?? 20, 1), 100);
  const rows = await db().sequelize.query<Row>(
    `${SELECT} WHERE j.workspace_id = $1 ${p.mine ? "AND j.user_id = $3" : ""} ORDER BY j.created_at DESC LIMIT $2`,
    { bind: p.mine ? [workspace.id, limit, p.actor!.userId] : [workspace.id, limit], type: QueryTypes.SELECT },
  );
  return Promise.all(rows.map((r) => view(r, false)));
}

/**
 * Stops a job: a queued one at once, a running one at the worker's next
 * heartbeat (within seconds). Whoever filed it, or an owner.
 */
export async function cancelJob(p: { actor: Actor | null; slug: string; jobId: string }): Promise<JobView> {
  const { workspace, role } = await requireAccess(p.actor, p.slug, "compile.run");
  const row = await load(workspace.id, p.jobId);
  if (row.user_id !== p.actor!.userId && role !== "owner") throw forbidden("cancelling another member's compile");
  await db().sequelize.query(
    `UPDATE compile_jobs SET cancel_requested = true, updated_at = now(),
            status = CASE WHEN status = 'queued' THEN 'cancelled' ELSE status END,
            finished_at = CASE WHEN status = 'queued' THEN now() ELSE finished_at END
     WHERE id = $1 AND status IN ('queued', 'running')`,
    { bind: [row.id], type: QueryTypes.UPDATE },
  );
  return view(await load(workspace.id, row.id), false);
}
