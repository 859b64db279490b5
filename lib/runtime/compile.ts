import "server-only";
/**
 * Compiles for the web server: the pipeline's one path (lib/pipeline
 * `compile`), with the stages on this process's warm worker pool under the
 * interactive budget, results kept by content hash per workspace, and the
 * pipeline's errors turned into the API's: a limit or a mapping failure is a
 * 422 whose details say what was reached and what to change.
 */
import { prepare, resolveSettings, type CompileResult, type Compiled, type ExportFormat, type PipelineError, type StageOutcome } from "../pipeline";
import type { Family } from "../families";
import type { Netlist } from "../map";
import type { NetlistDocument } from "../export";
import { CompilePool, QueueFull } from "../runtime/pool";
import { cacheKey, cachedResult, keepResult } from "../data/compile-cache";
import { AppError } from "../errors";
import type { DesignSettings } from "../pipeline";

/** Settings as the API takes and stores them (the pipeline's design settings; the family travels apart). */
export type CompileSettings = DesignSettings;

/** Wall-clock budget of one interactive compile, waiting for a thread included: 10 000 ms. */
export const COMPILE_BUDGET_MS = 10_000;
/** The minimizer's share of it: past this the exact route gives way to the heuristic, leaving time to map. */
export const MINIMIZE_SHARE = 0.7;

/** What a revision keeps of a run so that its files never change: the netlist and its JSON document. */
export interface SavedNetlist {
  model: Netlist;
  document: NetlistDocument;
  /** The estimated critical path (nets and gates), so a compare view marks it without recomputing; absent on older rows. */
  critical?: { nets: string[]; gates: string[] };
}

/** Settings as stored on designs and revisions: the schema's fields only. */
export function storedSettings(s: CompileSettings & { familyId?: unknown }): Record<string, unknown> {
  const { familyId: _ignored, ...rest } = s;
  return rest;
}

const g = globalThis as unknown as { fanboundPool?: CompilePool };

/** This process's compile pool, started on first use. */
export function compilePool(): CompilePool {
  return (g.fanboundPool ??= new CompilePool());
}

/** A pipeline error as the API's 422. */
export function asAppError(e: PipelineError): AppError {
  if (e.code === "mapping") return new AppError("compile_errors", e.message, { stage: "mapping" });
  return new AppError("compile_limit", e.message, { limit: e.code, what: e.what ?? null, hint: e.hint ?? null });
}

export interface ServerCompile {
  source: string;
  family: Family;
  settings: CompileSettings;
  /** Who asks: their runs share the pool fairly with everyone else's. */
  userId: string;
  /** The workspace whose cache the result joins; outside a workspace, the user's own. */
  workspaceId?: string | null;
  exports?: ExportFormat[];
  unitName?: string;
  signal?: AbortSignal;
  budgetMs?: number;
  /** The workspace's own families the settings may name at the design's edges (built-ins are found anyway). */
  families?: Family[];
}

/**
 * Compiles on the pool (or answers from the cache). Returns the diagnostics
 * and, when the source has no errors, the result; throws AppError 422 when a
 * limit or the family stops it, 429 when the caller has too many waiting.
 */
export async function compileOnServer(p: ServerCompile): Promise<Compiled & { cached: boolean }> {
  const input = {
    source: p.source, family: p.family, settings: resolveSettings(p.settings), exports: p.exports ?? [], unitName: p.unitName, families: p.families ?? [],
  };
  const { diagnostics, job } = prepare(input);
  if (!job) return { diagnostics, spec: null, result: null, error: null, cached: false };
  const budgetMs = p.budgetMs ?? COMPILE_BUDGET_MS;
  job.minimizeMs = Math.round(budgetMs * MINIMIZE_SHARE);
  const scope = p.workspaceId ? `ws:${p.workspaceId}` : `user:${p.userId}`;
  const key = cacheKey(scope, job);
  const hit = job.exports.length === 0 ? await cachedResult(key) : null;
  if (hit) return { diagnostics, spec: job.spec, result: hit, error: null, cached: true };
  let out: StageOutcome;
  try {
    out = await compilePool().executor(p.userId, budgetMs)(job, { ...(p.signal ? { signal: p.signal } : {}) });
  } catch (e) {
    if (e instanceof QueueFull) {
      throw new AppError("rate_limited", "You have several compiles waiting already; wait for them to finish, then try again.", { queue: "compile" }, 2);
    }
    throw e;
  }
  if (!out.ok) throw asAppError(out.error);
  await keepResult(key, scope, out.result);
  return { diagnostics, spec: job.spec, result: out.result, error: null, cached: false };
}

/** The part of a result the API sends (the netlist as its document). */
export function resultBody(r: CompileResult) {
  return {
    covers: r.covers,
    netlist: r.document,
    analysis: r.analysis,
    verification: r.verification,
    warnings: r.warnings,
    stats: r.stats,
    structures: r.structures,
  };
}
