import "server-only";
/**
 * Compile results kept by a content hash, so that the same compile — same
 * pipeline build, source, settings and family figures — is run once per
 * workspace (or per user, outside a workspace). The key includes the scope,
 * so one workspace never learns what another compiled.
 */
import { createHash } from "node:crypto";
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { QueryTypes } from "sequelize";
import { db } from "../db/connection";
import type { CompileResult, StageJob } from "../pipeline";

/** Results larger than this (serialized) are not kept: 16 MiB. */
export const MAX_CACHED_BYTES = 16 * 1024 * 1024;
/** Results unused this long are dropped: 30 days. */
export const CACHE_DAYS = 30;

let buildTag: string | null = null;

/** A hash of the built pipeline, so a new build never serves an older build's results. */
function pipelineBuild(): string {
  if (buildTag) return buildTag;
  const file = path.join(process.cwd(), ".build/pipeline-worker.mjs");
  buildTag = existsSync(file) ? createHash("sha256").update(readFileSync(file)).digest("hex").slice(0, 16) : "unbuilt";
  return buildTag;
}

/**
 * The cache key of a job in a scope ("ws:<id>" or "user:<id>"). Exports are
 * not part of a cached result, and the time the minimizer was given is not
 * part of the key: a result found with more time is as good or better, and a
 * job's result (run to the end) replaces one found within the interactive budget.
 *
 * `libraryRevisions` are the ids of the library block revisions the source's
 * use lines resolved to (any order). The job's function already holds what
 * they elaborated to; the ids are in the key as well, so a kept result is
 * never served for other block revisions even where a later stage reads more
 * of the source than its function.
 */
export function cacheKey(scope: string, job: StageJob, libraryRevisions: readonly string[] = []): string {
  const { exports: _e, unitName: _u, minimizeMs: _m, ...rest } = job;
  const pins = [...new Set(libraryRevisions)].sort();
  return createHash("sha256").update(JSON.stringify([pipelineBuild(), scope, rest, ...(pins.length ? [pins] : [])])).digest("hex");
}

export async function cachedResult(key: string): Promise<CompileResult | null> {
  const rows = await db().sequelize.query<{ result: CompileResult }>(
    "UPDATE compile_results SET used_at = now() WHERE key = $1 RETURNING result",
    { bind: [key], type: QueryTypes.SELECT },
  );
  return rows[0]?.result ?? null;
}

/**
 * Keeps a result; an exact one already kept under the key is not replaced by a
 * later (possibly heuristic) one. Answers the size of the result as kept, or
 * `{ kept: false }` with its size when it is larger than MAX_CACHED_BYTES.
 */
export async function keepResult(key: string, scope: string, result: CompileResult): Promise<{ kept: boolean; bytes: number }> {
  const { exports: _e, ...kept } = result;
  const text = JSON.stringify({ ...kept, exports: {} });
  if (text.length > MAX_CACHED_BYTES) return { kept: false, bytes: text.length };
  await db().sequelize.query(
    `INSERT INTO compile_results (key, scope, result, bytes, created_at, used_at) VALUES ($1, $2, $3::jsonb, $4, now(), now())
     ON CONFLICT (key) DO UPDATE SET used_at = now(),
       result = CASE WHEN (compile_results.result->'covers'->>'exact')::boolean THEN compile_results.result ELSE EXCLUDED.result END,
       bytes = CASE WHEN (compile_results.result->'covers'->>'exact')::boolean THEN compile_results.bytes ELSE EXCLUDED.bytes END`,
    { bind: [key, scope, text, text.length], type: QueryTypes.INSERT },
  );
  // Now and then, drop what has not been used for a month.
  if (Math.random() < 0.01) {
    await db().sequelize.query(`DELETE FROM compile_results WHERE used_at < now() - interval '${CACHE_DAYS} days'`);
  }
  return { kept: true, bytes: text.length };
}
