import "server-only";
/**
 * The seam between the API and the pipeline: source, settings and family in;
 * diagnostics, covers, netlist, analysis and the figures a revision stores out.
 * Compile limits of the minimizer become a 422 naming the limit.
 */
import { z } from "zod";
import { compileSource, type Diagnostic } from "../lang";
import { minimize, LimitError, type MinimizeResult } from "../minimize";
import { mapCovers, MapError, TARGET_FORMS, type Netlist } from "../map";
import { analyse, type Analysis } from "../analysis";
import { toJsonDocument, type NetlistDocument } from "../export";
import type { Family } from "../families";
import { AppError } from "./errors";

/** Settings of a compilation; every field optional with the pipeline's defaults. */
export const CompileSettings = z
  .object({
    form: z.enum(["sop", "pos"]).optional().describe("two-level form to minimize; default sop"),
    target: z.enum(TARGET_FORMS as unknown as [string, ...string[]]).optional().describe("gate set to map onto; default and-or"),
    heuristic: z.boolean().optional().describe("skip the exact route; default false"),
    fanIn: z.int().min(2).max(64).optional().describe("widest gate input allowed; default the family's"),
    fanOut: z.int().min(2).max(1000).optional().describe("fan-out limit in unit loads; default the family's"),
    complementedInputs: z.boolean().optional().describe("complemented inputs come from outside; default false"),
    outputPinLoad: z.number().min(0).max(100).optional().describe("unit loads per output pin; default 1"),
    clockMHz: z.number().positive().max(10_000).optional().describe("clock for dynamic power, MHz; default 10"),
    activity: z.number().min(0).max(1).optional().describe("0→1 transitions per cycle; default 0.25"),
  })
  .strict();
export type CompileSettings = z.infer<typeof CompileSettings>;

/** Figures stored with a revision; sortable keys of the design list. */
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
}

export interface CompileResult {
  covers: MinimizeResult;
  netlist: NetlistDocument;
  analysis: Analysis;
  warnings: string[];
  stats: RevisionStats;
}

export interface CompileOutcome {
  diagnostics: Diagnostic[];
  /** null when the source has errors. */
  result: CompileResult | null;
  /** The mapped netlist (for the exporters); null with result. */
  netlistModel: Netlist | null;
}

/** Runs the pipeline; throws AppError 422 for compile limits and families that cannot build the design. */
export function compileDesign(source: string, settings: CompileSettings, family: Family): CompileOutcome {
  const compiled = compileSource(source);
  if (!compiled.spec) return { diagnostics: compiled.diagnostics, result: null, netlistModel: null };
  try {
    const covers = minimize(compiled.spec, { form: settings.form, heuristic: settings.heuristic });
    const mapped = mapCovers(covers, family, {
      form: settings.target as (typeof TARGET_FORMS)[number] | undefined,
      fanIn: settings.fanIn,
      fanOut: settings.fanOut,
      complementedInputs: settings.complementedInputs,
      outputPinLoad: settings.outputPinLoad,
      spec: compiled.spec,
    });
    const analysis = analyse(mapped.netlist, mapped.family, {
      fanOut: mapped.fanOut,
      outputPinLoad: mapped.outputPinLoad,
      clockMHz: settings.clockMHz,
      activity: settings.activity,
    });
    const warnings = [...mapped.warnings, ...analysis.warnings];
    const netlist = toJsonDocument(mapped.netlist, analysis, warnings);
    const stats: RevisionStats = {
      inputs: covers.inputs.length,
      outputs: covers.outputs.length,
      products: covers.cost,
      literals: covers.outputs.reduce((s, o) => s + o.literals, 0),
      exact: covers.exact,
      gates: analysis.gates,
      depth: analysis.depth,
      delayNs: analysis.criticalPath.delay.value,
      packages: analysis.packages,
      transistors: analysis.transistors,
      staticMw: analysis.staticPower.value,
      dynamicMw: analysis.dynamicPower.value,
      maxLoad: analysis.maxLoad,
    };
    return { diagnostics: compiled.diagnostics, result: { covers, netlist, analysis, warnings, stats }, netlistModel: mapped.netlist };
  } catch (e) {
    if (e instanceof LimitError) {
      throw new AppError("compile_limit", e.message, { limit: e.limit, value: e.value, hint: e.hint });
    }
    if (e instanceof MapError) {
      throw new AppError("compile_errors", e.message, { stage: "map" });
    }
    throw e;
  }
}
