/**
 * The pipeline with minimization on a worker thread, for the web server: a
 * long run keeps to a wall-clock budget and can be cancelled. Server-side
 * only (the worker uses node:worker_threads); mapping runs in the caller.
 */
import { compileSource } from "../lang/index";
import { LimitError } from "../minimize/index";
import { minimizeInWorker } from "../minimize/worker";
import { familyError, finish, minimizeOptionsFor, resolveFamily, type PipelineOptions, type PipelineResult } from "./index";
import type { DesignSettings } from "./settings";

export interface AsyncPipelineOptions extends PipelineOptions {
  /** Cancels the minimization. */
  signal?: AbortSignal;
  /** Wall-clock budget of the minimization in ms; default 30 000 (the worker's default). */
  budgetMs?: number;
}

/** compileDesign with the minimizer on a worker; a budget overrun or abort comes back as error code "limit". */
export async function compileDesignAsync(source: string, settings: DesignSettings, opts: AsyncPipelineOptions = {}): Promise<PipelineResult> {
  const compiled = compileSource(source);
  const none = { minimized: null, netlist: null, analysis: null, verification: null, warnings: [] as string[] };
  if (!compiled.spec) return { ok: false, diagnostics: compiled.diagnostics, spec: null, ...none, error: { code: "language", message: "the design has errors; see the diagnostics" } };
  const family = resolveFamily(settings.familyId, opts.families);
  if (!family) return { ok: false, diagnostics: compiled.diagnostics, spec: compiled.spec, ...none, error: familyError(settings.familyId, opts.families) };
  try {
    const minimized = await minimizeInWorker(
      compiled.spec,
      { ...minimizeOptionsFor(settings, family), ...opts.minimize },
      { ...(opts.signal ? { signal: opts.signal } : {}), ...(opts.budgetMs !== undefined ? { budgetMs: opts.budgetMs } : {}) },
    );
    return finish(compiled.diagnostics, compiled.spec, minimized, family, settings, opts);
  } catch (e) {
    if (e instanceof LimitError) return { ok: false, diagnostics: compiled.diagnostics, spec: compiled.spec, ...none, error: { code: "limit", message: e.message } };
    throw e;
  }
}
