/**
 * The whole pipeline, one path for every caller: source → parse and
 * elaborate (here, at once: diagnostics come back without waiting for
 * anything) → the stages (minimize → map → factor → analyse → verify → export),
 * run by an executor the caller chooses: in this thread (the CLI, the seed,
 * the tests), on a pool of warm worker threads (the web server), or as a job
 * on a worker process (long runs). Errors come back as values; only bugs throw.
 */
import { compileSource, type Diagnostic, type LibraryResolver, type UsedBlock } from "../lang/index";
import type { FunctionSpec } from "../logic/index";
import { BUILT_IN_FAMILIES, type Family } from "../families/index";
import { resolveSettings, type DesignSettings } from "./settings";
import { runInThread, runStages, type CompileResult, type Executor, type ExportFormat, type PipelineError, type RunControl, type StageJob } from "./stages";

export * from "./settings";
export * from "./stages";
export { revisionStats, type RevisionStats } from "./stats";

/** What one compile is asked to do. */
export interface CompileInput {
  source: string;
  family: Family;
  /** Missing fields take their defaults (DEFAULT_SETTINGS). */
  settings?: DesignSettings;
  /** Exports to render; default none. */
  exports?: ExportFormat[];
  /** Module/entity name for Verilog and VHDL; default "design_top". */
  unitName?: string;
  /** Wall-clock budget of the minimization, ms; default the minimizer's (10 000). The exact route then gives way to the heuristic. */
  minimizeMs?: number;
  /**
   * Families the settings may name at the design's edges (inputsDrivenBy,
   * outputsDrive) besides the built-ins, e.g. the workspace's own; default none.
   */
  families?: readonly Family[];
  /** Build the structure the settings do not keep as well, for its figures (StageJob.compare); default true. */
  compare?: boolean;
  /** Answers the source's `use` lines (see lib/lang LibraryResolver); without it a `use` line is an error. */
  resolve?: LibraryResolver;
}

export interface Compiled {
  /** Errors and warnings of the source, ordered by position. */
  diagnostics: Diagnostic[];
  /** The elaborated function; null when the source has errors. */
  spec: FunctionSpec | null;
  /** The library blocks the source's use lines brought in. */
  libraries: UsedBlock[];
  /** null when the source has errors or the stages stopped (see error). */
  result: CompileResult | null;
  error: PipelineError | null;
}

/** Parses the source; a source with errors ends here with its diagnostics. */
export function prepare(input: CompileInput): { diagnostics: Diagnostic[]; libraries: UsedBlock[]; job: StageJob | null } {
  const compiled = compileSource(input.source, input.resolve ? { resolve: input.resolve } : undefined);
  if (!compiled.spec) return { diagnostics: compiled.diagnostics, libraries: compiled.libraries, job: null };
  return {
    diagnostics: compiled.diagnostics,
    libraries: compiled.libraries,
    job: {
      spec: compiled.spec,
      family: input.family,
      settings: resolveSettings(input.settings),
      exports: input.exports ?? [],
      ...(input.unitName !== undefined ? { unitName: input.unitName } : {}),
      ...(input.minimizeMs !== undefined ? { minimizeMs: input.minimizeMs } : {}),
      ...boundaryOf(input.settings, input.families),
      ...(input.compare !== undefined ? { compare: input.compare } : {}),
    },
  };
}

/**
 * The families the settings name at the design's edges, resolved among the
 * given families, then the built-ins; an unknown one is a warning, not an error.
 */
function boundaryOf(settings: DesignSettings = {}, families: readonly Family[] = []): Pick<StageJob, "boundary"> {
  const boundary: NonNullable<StageJob["boundary"]> = {};
  for (const side of ["inputsDrivenBy", "outputsDrive"] as const) {
    const id = settings[side];
    if (!id) continue;
    const f = families.find((x) => x.id === id) ?? BUILT_IN_FAMILIES.find((x) => x.id === id);
    if (f) boundary[side] = f;
    else {
      const what = side === "inputsDrivenBy" ? "the family driving the inputs" : "the family the outputs drive";
      (boundary.warnings ??= []).push(`${what}, "${id}", is unknown: that boundary is not checked`);
    }
  }
  return Object.keys(boundary).length ? { boundary } : {};
}

/** The one entry: parse, then the stages on `execute` (default this thread). */
export async function compile(input: CompileInput, execute: Executor = runInThread, control: RunControl = {}): Promise<Compiled> {
  const { diagnostics, libraries, job } = prepare(input);
  if (!job) return { diagnostics, spec: null, libraries, result: null, error: null };
  const out = await execute(job, control);
  return out.ok
    ? { diagnostics, spec: job.spec, libraries, result: out.result, error: null }
    : { diagnostics, spec: job.spec, libraries, result: null, error: out.error };
}

/** {@link compile} on this thread, synchronously: for scripts, the seed and tests. */
export function compileNow(input: CompileInput): Compiled {
  const { diagnostics, libraries, job } = prepare(input);
  if (!job) return { diagnostics, spec: null, libraries, result: null, error: null };
  const out = runStages(job);
  return out.ok
    ? { diagnostics, spec: job.spec, libraries, result: out.result, error: null }
    : { diagnostics, spec: job.spec, libraries, result: null, error: out.error };
}
