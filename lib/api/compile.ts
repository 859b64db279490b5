import "server-only";
/**
 * The seam between the API and lib/pipeline: source, settings and a family
 * record in; diagnostics, covers, netlist, analysis and the figures a revision
 * stores out. Compile limits become a 422 naming the limit.
 *
 * Small designs (up to IN_THREAD_MAX_INPUTS inputs) minimize in-thread, where
 * a run takes milliseconds and a worker's start (about 350 ms) would dominate.
 * Larger ones go to a worker thread with the wall-clock budget and the
 * request's abort signal, so a long run neither holds the server nor outlives
 * the client that asked for it.
 */
import path from "node:path";
import type { z } from "zod";
import { compileSource, type Diagnostic } from "../lang";
import { LimitError, minimize, type MinimizeOptions, type MinimizeResult } from "../minimize";
import { minimizeInWorker } from "../minimize/worker";
import type { FunctionSpec } from "../logic";
import { revisionStats, type RevisionStats } from "../pipeline/stats";
import { finish, minimizeOptionsFor, type DesignSettings, type ExportFormat } from "../pipeline";
import type { Family } from "../families";
import { AppError } from "./errors";

import type { CompileSettings as CompileSettingsSchema } from "./routes";
export type CompileSettings = Omit<z.infer<typeof CompileSettingsSchema>, "familyId">;

/** Wall-clock budget of one minimization behind the API: 10 000 ms (the exact route then gives way to the heuristic). */
export const COMPILE_BUDGET_MS = 10_000;

export type { RevisionStats };

export interface CompileOutcome {
  diagnostics: Diagnostic[];
  /** null when the source has errors (see diagnostics). */
  result: {
    covers: MinimizeResult;
    netlist: unknown;
    analysis: unknown;
    verification: unknown;
    warnings: string[];
    stats: RevisionStats;
  } | null;
  exports: Partial<Record<ExportFormat, string>>;
}

/** Settings without the family, as stored on designs and revisions. */
export function storedSettings(s: CompileSettings & { familyId?: string }): Record<string, unknown> {
  const { familyId: _ignored, ...rest } = s;
  return rest;
}

/** A minimizer LimitError as the API's 422 "compile_limit" naming the limit; anything else unchanged. */
export function asCompileError(e: unknown): unknown {
  if (e instanceof LimitError) {
    return new AppError("compile_limit", `Compile limit ${e.limit} reached: ${e.message}`, { limit: e.limit, value: e.value, hint: e.hint });
  }
  return e;
}

/** Designs with at most this many inputs minimize on the request's own thread. */
export const IN_THREAD_MAX_INPUTS = 10;

/** The worker's entry on disk; the server bundle cannot hold it, the source tree does. */
const WORKER_BOOT = path.join(process.cwd(), "lib/minimize/worker-boot.mjs");

function runMinimize(spec: FunctionSpec, options: MinimizeOptions, signal?: AbortSignal): Promise<MinimizeResult> | MinimizeResult {
  const opts = { ...options, timeLimitMs: COMPILE_BUDGET_MS };
  if (spec.inputs.length <= IN_THREAD_MAX_INPUTS) return minimize(spec, opts);
  // The worker's own budget is a little longer than the minimizer's, so the
  // exact route's fallback to the heuristic gets to answer first.
  return minimizeInWorker(spec, opts, { budgetMs: COMPILE_BUDGET_MS + 5_000, bootFile: WORKER_BOOT, ...(signal ? { signal } : {}) });
}

/**
 * Runs the pipeline for one family record (its key is the pipeline's family id).
 * Throws AppError 422: "compile_limit" (details.limit names it) or
 * "compile_errors" when the family cannot build the design.
 */
export async function compileDesign(
  source: string,
  settings: CompileSettings,
  family: Family,
  opts: { exports?: ExportFormat[]; unitName?: string; signal?: AbortSignal } = {},
): Promise<CompileOutcome> {
  const compiled = compileSource(source);
  if (!compiled.spec) return { diagnostics: compiled.diagnostics, result: null, exports: {} };
  const full: DesignSettings = { ...storedSettings(settings), familyId: family.id };
  let minimized: MinimizeResult;
  try {
    minimized = await runMinimize(compiled.spec, minimizeOptionsFor(full, family), opts.signal);
  } catch (e) {
    throw asCompileError(e);
  }
  const r = finish(compiled.diagnostics, compiled.spec, minimized, family, full, { families: [family], exports: opts.exports, unitName: opts.unitName });
  if (!r.ok || !r.analysis || !r.document) {
    throw new AppError("compile_errors", r.error?.message ?? "The design could not be mapped onto the family.", { stage: r.error?.code ?? "mapping" });
  }
  const a = r.analysis;
  const stats = revisionStats(r)!;

  return {
    diagnostics: r.diagnostics,
    result: { covers: minimized, netlist: r.document, analysis: a, verification: r.verification, warnings: r.warnings, stats },
    exports: r.exports ?? {},
  };
}
