import "server-only";
/**
 * The seam between the API and lib/pipeline: source, settings and a family
 * record in; diagnostics, covers, netlist, analysis and the figures a revision
 * stores out. Compile limits become a 422 naming the limit.
 *
 * The minimizer runs in-thread with its wall-clock budget: the worker variant
 * (lib/minimize/worker.ts) boots through tsx from source files, which the Next
 * server bundle cannot load.
 */
import type { z } from "zod";
import { compileSource, type Diagnostic } from "../lang";
import { LimitError, minimize, type MinimizeResult } from "../minimize";
import { finish, minimizeOptionsFor, type DesignSettings, type ExportFormat } from "../pipeline";
import type { Family } from "../families";
import { AppError } from "./errors";

import type { CompileSettings as CompileSettingsSchema } from "./routes";
export type CompileSettings = Omit<z.infer<typeof CompileSettingsSchema>, "familyId">;

/** Wall-clock budget of one minimization behind the API: 10 000 ms (the exact route then gives way to the heuristic). */
export const COMPILE_BUDGET_MS = 10_000;

/** Figures stored with a revision; gates, depth and delayNs are the sort keys of the design list. */
export interface RevisionStats {
  inputs: number;
  outputs: number;
  products: number;
  literals: number;
  exact: boolean;
  gates: number;
  depth: number;
  delayNs: number | null;
  packages: number | null;
  transistors: number | null;
  staticMw: number | null;
  dynamicMw: number | null;
  maxLoad: number;
  verified: boolean | null;
}

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

function runMinimize(spec: Parameters<typeof minimize>[0], options: Parameters<typeof minimize>[1]) {
  return minimize(spec, { ...options, timeLimitMs: COMPILE_BUDGET_MS });
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
  opts: { exports?: ExportFormat[]; unitName?: string } = {},
): Promise<CompileOutcome> {
  const compiled = compileSource(source);
  if (!compiled.spec) return { diagnostics: compiled.diagnostics, result: null, exports: {} };
  const full: DesignSettings = { ...storedSettings(settings), familyId: family.id };
  let minimized: MinimizeResult;
  try {
    minimized = runMinimize(compiled.spec, minimizeOptionsFor(full, family));
  } catch (e) {
    throw asCompileError(e);
  }
  const r = finish(compiled.diagnostics, compiled.spec, minimized, family, full, { families: [family], ...opts });
  if (!r.ok || !r.analysis || !r.document) {
    throw new AppError("compile_errors", r.error?.message ?? "The design could not be mapped onto the family.", { stage: r.error?.code ?? "mapping" });
  }
  const a = r.analysis;
  const stats: RevisionStats = {
    inputs: minimized.inputs.length,
    outputs: minimized.outputs.length,
    products: new Set(minimized.outputs.flatMap((o) => o.cubes.map((c) => `${o.form}:${c.value}/${c.mask}`))).size,
    literals: minimized.outputs.reduce((s, o) => s + o.literals, 0),
    exact: minimized.exact,
    gates: a.gates,
    depth: a.depth,
    delayNs: a.criticalPath.delay.value,
    packages: a.packages,
    transistors: a.transistors,
    staticMw: a.staticPower.value,
    dynamicMw: a.dynamicPower.value,
    maxLoad: a.maxLoad,
    verified: r.verification ? r.verification.ok : null,
  };
  return {
    diagnostics: r.diagnostics,
    result: { covers: minimized, netlist: r.document, analysis: a, verification: r.verification, warnings: r.warnings, stats },
    exports: r.exports ?? {},
  };
}
