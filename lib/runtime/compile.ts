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
import { answersForSource, pinsOf, resolverOf, type LibraryAnswers, type ResolvedBlock } from "../data/library-resolve";
import { requestKey, type UsedBlock } from "../lang";
import { figureDeltas, portChange } from "../libraries";
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
  /**
   * Answers for the use lines, when the caller has them already (a saved
   * revision's pinned list); otherwise they are loaded from the libraries the
   * workspace may use.
   */
  libraryAnswers?: LibraryAnswers;
}

/** A library block revision a compile used: the use line, the block's ports and stored figures, and any newer revision. */
export interface LibraryUse extends UsedBlock {
  libraryId: string;
  libraryName: string;
  libraryRevisionId: string;
  stats: ResolvedBlock["stats"];
  newer: ResolvedBlock["newer"];
}

function libraryUses(used: UsedBlock[], loaded: LibraryAnswers | null): LibraryUse[] {
  if (!loaded) return [];
  return used.flatMap((u) => {
    const r = loaded.resolved.get(requestKey({ library: u.library, block: u.block, revision: u.revision }));
    return r ? [{ ...u, libraryId: r.libraryId, libraryName: r.libraryName, libraryRevisionId: r.libraryRevisionId, stats: r.stats, newer: r.newer }] : [];
  });
}

/**
 * Compiles on the pool (or answers from the cache). Returns the diagnostics
 * and, when the source has no errors, the result; throws AppError 422 when a
 * limit or the family stops it, 429 when the caller has too many waiting.
 */
export async function compileOnServer(p: ServerCompile): Promise<Compiled & { cached: boolean; libraryUses: LibraryUse[] }> {
  // Library revisions are loaded before parsing: the core's resolver answers synchronously from this list.
  const loaded = p.libraryAnswers ?? (/\buse\b/.test(p.source) ? await answersForSource(p.workspaceId ?? null, p.source) : null);
  const input = {
    source: p.source, family: p.family, settings: resolveSettings(p.settings), exports: p.exports ?? [], unitName: p.unitName, families: p.families ?? [],
    ...(loaded ? { resolve: resolverOf(loaded) } : {}),
  };
  const { diagnostics, libraries, job } = prepare(input);
  const libraryUsesOf = libraryUses(libraries, loaded);
  if (!job) return { diagnostics, spec: null, libraries, libraryUses: libraryUsesOf, result: null, error: null, cached: false };
  const budgetMs = p.budgetMs ?? COMPILE_BUDGET_MS;
  job.minimizeMs = Math.round(budgetMs * MINIMIZE_SHARE);
  const scope = p.workspaceId ? `ws:${p.workspaceId}` : `user:${p.userId}`;
  const key = cacheKey(scope, job, loaded ? pinsOf(loaded) : []);
  const hit = job.exports.length === 0 ? await cachedResult(key) : null;
  if (hit) return { diagnostics, spec: job.spec, libraries, libraryUses: libraryUsesOf, result: hit, error: null, cached: true };
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
  return { diagnostics, spec: job.spec, libraries, libraryUses: libraryUsesOf, result: out.result, error: null, cached: false };
}

/** A library use as the API sends it: with the figure deltas of moving to the newer revision (stored figures, never recomputed). */
export function libraryUseBody(u: LibraryUse) {
  return {
    library: u.library, libraryName: u.libraryName, libraryId: u.libraryId, block: u.block, revision: u.revision,
    inputs: u.inputs, outputs: u.outputs, range: u.range, revisionRange: u.revisionRange, stats: u.stats,
    newer: u.newer
      ? {
          number: u.newer.number, message: u.newer.message, inputs: u.newer.inputs, outputs: u.newer.outputs,
          deltas: figureDeltas(u.stats, u.newer.stats),
          portChange: portChange(u, u.newer),
        }
      : null,
  };
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
