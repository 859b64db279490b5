/**
 * The pipeline's stages after parsing — minimize → map (with the proof that
 * the netlist equals the specification) → factor (the multi-level structure,
 * proven too) → analyse → export — as one pure
 * function on plain data, and what an executor of them looks like. This is
 * all a compile worker thread loads: no parser, no layout engine.
 */
import type { FunctionSpec } from "../logic/index";
import { LimitError, minimize, type MinimizeOptions, type MinimizeProgress, type MinimizeResult } from "../minimize/index";
import type { Family } from "../families/index";
import { mapCovers, MapError, type MapResult, type VerifyResult, type Netlist } from "../map/index";
import { analyse, type Analysis } from "../analysis/index";
import { toCsv } from "../export/csv";
import { toJsonDocument, type NetlistDocument } from "../export/json";
import { toVerilog } from "../export/verilog";
import { toVhdl } from "../export/vhdl";
import type { ResolvedSettings } from "./settings";
import { revisionStats, type RevisionStats } from "./stats";
import { chooseStructure, type StructureChoice, type StructureFigures } from "./structures";

export type { StructureFigures } from "./structures";

export type ExportFormat = "verilog" | "vhdl" | "csv" | "json";

/** The stages' whole input: plain data, so it crosses to a worker thread or a job unchanged. */
export interface StageJob {
  spec: FunctionSpec;
  family: Family;
  settings: ResolvedSettings;
  exports: ExportFormat[];
  unitName?: string;
  minimizeMs?: number;
  /** The families at the design's edges (see DesignSettings.inputsDrivenBy), resolved; warnings for names not found. */
  boundary?: { inputsDrivenBy?: Family; outputsDrive?: Family; warnings?: string[] };
  /**
   * Build the structure the settings do not keep as well, for its figures in
   * `structures` (the factored one beside a kept two-level one); default true.
   * The CLI's map sets it false when it prints one netlist only.
   */
  compare?: boolean;
}

/** Everything the stages produce for one design. */
export interface CompileResult {
  covers: MinimizeResult;
  /** The netlist as the later stages and the HDL exporters read it. */
  model: Netlist;
  /** The netlist document the API and the CLI show. */
  document: NetlistDocument;
  analysis: Analysis;
  verification: VerifyResult | null;
  warnings: string[];
  /** The small flat summary a revision stores. */
  stats: RevisionStats;
  /**
   * Figures of the two-level structure and, when it was built, the factored one, side by side;
   * `kept` marks the one the netlist, analysis, stats and exports above belong to (settings.structure).
   */
  structures: StructureFigures[];
  exports: Partial<Record<ExportFormat, string>>;
}

export interface PipelineError {
  /** "limit": a time, size or memory limit stopped the run; "cancelled": the caller stopped it; "mapping": the family cannot build the design. */
  code: "limit" | "cancelled" | "mapping";
  message: string;
  /** For limits: what was reached, in words ("time limit of 10 s"). */
  what?: string;
  /** What to change. */
  hint?: string;
}

export type StageOutcome = { ok: true; result: CompileResult } | { ok: false; error: PipelineError };

/** Where a run stands, for a progress bar. */
export interface Progress {
  /** "map" and "factor" include the proof that the netlist equals the specification; "factor" builds the multi-level structure. */
  stage: "minimize" | "map" | "factor" | "analyse" | "export";
  /** Multi-output prime implicants found, once known (the minimizer's exact route). */
  primes?: number;
  /** Cost of the best cover so far and its proven lower bound, once known. */
  cost?: number;
  lowerBound?: number;
}

export interface RunControl {
  /** Stops the run; it ends as error "cancelled" (or "limit" when the signal's reason is a timeout). */
  signal?: AbortSignal;
  onProgress?: (p: Progress) => void;
}

/** Runs the stages of a StageJob somewhere. */
export type Executor = (job: StageJob, control: RunControl) => Promise<StageOutcome>;

/** Minimizer options for the settings (form from the gate form, cost model). */
export function minimizeOptionsFor(settings: ResolvedSettings, family: Family): MinimizeOptions {
  const fanIn = settings.fanIn ?? family.fanIn ?? widest(family);
  return {
    form: settings.form === "or-and" || settings.form === "nor" ? "pos" : "sop",
    cost: settings.cost === "fan-in" ? { kind: "fan-in", fanIn: Math.max(2, fanIn) } : { kind: settings.cost },
    heuristic: settings.heuristic,
  };
}

function widest(f: Family): number {
  let w = 0;
  for (const g of f.gates ?? []) if (g.type !== "NOT" && g.type !== "BUF") for (const x of g.widths) w = Math.max(w, x.width);
  return w || 4;
}

/** The stages on this thread: minimize → map and verify → factor and verify (./structures) → analyse → export. Pure and synchronous. */
export function runStages(job: StageJob, onProgress?: (p: Progress) => void): StageOutcome {
  const { spec, family, settings } = job;
  let covers: MinimizeResult;
  onProgress?.({ stage: "minimize" });
  try {
    covers = minimize(spec, {
      ...minimizeOptionsFor(settings, family),
      ...(job.minimizeMs !== undefined ? { timeLimitMs: job.minimizeMs } : {}),
      ...(onProgress ? { onProgress: (p: MinimizeProgress) => onProgress({ stage: "minimize", ...p }) } : {}),
    });
  } catch (e) {
    if (e instanceof LimitError) return { ok: false, error: limitError(e) };
    throw e;
  }
  // The heuristic alone lists no primes (-1).
  const figures = { ...(covers.primes >= 0 ? { primes: covers.primes } : {}), cost: covers.cost, lowerBound: covers.lowerBound };
  onProgress?.({ stage: "map", ...figures });
  const mapOptions = {
    form: settings.form,
    ...(settings.fanIn !== undefined ? { fanIn: settings.fanIn } : {}),
    ...(settings.fanOut !== undefined ? { fanOut: settings.fanOut } : {}),
    complementedInputs: settings.complementedInputs,
    outputPinLoad: settings.outputPinLoad,
    spareInverters: settings.spareInverters,
    spec,
  };
  const analyseMapped = (m: MapResult) =>
    analyse(m.netlist, m.family, {
      fanOut: m.fanOut,
      outputPinLoad: m.outputPinLoad,
      clockMHz: settings.clockMHz,
      activity: settings.activity,
      ...(job.boundary ? { boundary: job.boundary } : {}),
    });
  let chosen: StructureChoice;
  try {
    const twoLevel = mapCovers(covers, family, mapOptions);
    // the factored structure (lib/factor) when the settings keep it or the caller compares (./structures)
    const compare = job.compare !== false;
    chosen = chooseStructure(spec, covers, family, settings, mapOptions, twoLevel, analyseMapped, compare, (stage) =>
      onProgress?.({ stage, ...figures }),
    );
  } catch (e) {
    if (e instanceof MapError) return { ok: false, error: { code: "mapping", message: e.message } };
    throw e;
  }
  const { mapped, analysis, structures, built } = chosen;
  const warnings = [...mapped.warnings, ...(job.boundary?.warnings ?? []), ...analysis.warnings];
  const document = toJsonDocument(mapped.netlist, analysis, warnings);
  onProgress?.({ stage: "export", ...figures });
  const header = [`Fanbound netlist, family ${family.name} (${family.id}), form ${mapped.form}${built ? `, factored (${built})` : ""}`];
  const exports: Partial<Record<ExportFormat, string>> = {};
  for (const f of job.exports) {
    const hdl = { name: job.unitName, header };
    exports[f] = f === "verilog" ? toVerilog(mapped.netlist, hdl) : f === "vhdl" ? toVhdl(mapped.netlist, hdl) : f === "csv" ? toCsv(mapped.netlist) : JSON.stringify(document, null, 2);
  }
  return {
    ok: true,
    result: {
      covers,
      model: mapped.netlist,
      document,
      analysis,
      verification: mapped.verification,
      warnings,
      stats: revisionStats(spec, covers, analysis, mapped.verification, settings.structure),
      structures,
      exports,
    },
  };
}

/** A minimizer limit in the words a designer reads: what was reached and what to change. */
export function limitError(e: LimitError): PipelineError {
  const what = (e as LimitError & { what?: string }).what ?? `${e.limit} limit`;
  return { code: "limit", message: e.message, what, hint: e.hint };
}

/** The executor of the CLI, the seed and the tests: the stages on this thread (a signal is checked before they start). */
export const runInThread: Executor = async (job, control) => {
  if (control.signal?.aborted) return { ok: false, error: cancelledError(control.signal) };
  return runStages(job, control.onProgress);
};

/** The error of a run stopped by its signal: a timeout is a limit, anything else a cancel. */
export function cancelledError(signal: AbortSignal): PipelineError {
  const reason = signal.reason as { name?: string; budgetMs?: number } | undefined;
  if (reason?.name === "TimeoutError") {
    const s = reason.budgetMs ? `${Math.round(reason.budgetMs / 100) / 10} s` : "the time budget";
    return {
      code: "limit",
      message: `The compile did not finish within ${s}.`,
      what: `time limit of ${s}`,
      hint: "Run it to the end as a background job, tick Heuristic only for a quick cover with a proven bound, or split the design into smaller designs.",
    };
  }
  return { code: "cancelled", message: "The compile was stopped before it finished.", hint: "Run it again when needed." };
}

