import "server-only";
/**
 * The seam between the API and lib/pipeline: source, settings and a family
 * record in; diagnostics, covers, netlist, analysis and the figures a revision
 * stores out. Compile limits become a 422 naming the limit.
 *
 * Small designs minimize in-thread, where a run takes milliseconds and a
 * worker's start (about 350 ms) would dominate. Larger ones go to a worker
 * thread — at most WORKER_SLOTS at once — with the wall-clock budget and the
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
import type { Netlist } from "../map";
import type { NetlistDocument } from "../export";
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
  /** What a revision keeps of this run so that its files never change: the netlist and its JSON document. */
  saved: SavedNetlist | null;
}

/** The netlist a revision keeps; its files are rendered from this, never recomputed. */
export interface SavedNetlist {
  model: Netlist;
  document: NetlistDocument;
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

/**
 * Designs this small (inputs and outputs both at most 8) minimize on the
 * request's own thread in milliseconds, with a short budget of their own;
 * everything else goes to a worker thread, so no request holds the server.
 */
export const IN_THREAD_MAX_INPUTS = 8;
export const IN_THREAD_MAX_OUTPUTS = 8;
const IN_THREAD_BUDGET_MS = 2_000;

/** At most this many minimizations run on workers at once (the machine has few cores); the rest wait their turn. */
export const WORKER_SLOTS = 2;

/** The worker's entry on disk; the server bundle cannot hold it, the source tree does. */
const WORKER_BOOT = path.join(process.cwd(), "lib/minimize/worker-boot.mjs");

const slots = { busy: 0, waiting: [] as Array<() => void> };

/** Waits for a free worker slot; a cancelled request leaves the queue. */
function acquireSlot(signal?: AbortSignal): Promise<() => void> {
  const release = () => {
    slots.busy--;
    slots.waiting.shift()?.();
  };
  if (slots.busy < WORKER_SLOTS) {
    slots.busy++;
    return Promise.resolve(release);
  }
  return new Promise((resolve, reject) => {
    const go = () => {
      signal?.removeEventListener("abort", onAbort);
      slots.busy++;
      resolve(release);
    };
    const onAbort = () => {
      slots.waiting = slots.waiting.filter((w) => w !== go);
      reject(new LimitError("aborted", 0, "the run was cancelled while it waited for a free worker", "Start it again when needed."));
    };
    signal?.addEventListener("abort", onAbort, { once: true });
    slots.waiting.push(go);
  });
}

export function runsInThread(spec: FunctionSpec): boolean {
  return spec.inputs.length <= IN_THREAD_MAX_INPUTS && spec.outputs.length <= IN_THREAD_MAX_OUTPUTS;
}

async function runMinimize(spec: FunctionSpec, options: MinimizeOptions, signal?: AbortSignal): Promise<MinimizeResult> {
  if (runsInThread(spec)) return minimize(spec, { ...options, timeLimitMs: IN_THREAD_BUDGET_MS });
  const release = await acquireSlot(signal);
  try {
    // The worker's own budget is a little longer than the minimizer's, so the
    // exact route's fallback to the heuristic gets to answer first.
    return await minimizeInWorker(spec, { ...options, timeLimitMs: COMPILE_BUDGET_MS }, {
      budgetMs: COMPILE_BUDGET_MS + 5_000,
      bootFile: WORKER_BOOT,
      ...(signal ? { signal } : {}),
    });
  } finally {
    release();
  }
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
  if (!compiled.spec) return { diagnostics: compiled.diagnostics, result: null, exports: {}, saved: null };
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
    saved: r.netlist && r.document ? { model: r.netlist, document: r.document } : null,
  };
}
