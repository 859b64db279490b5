/**
 * The whole pipeline as one pure function: source → compile → minimize →
 * map → analyse → verify → export. Used by the REST API, the workbench and
 * the seed script. Errors come back as values in `error`; only bugs throw.
 */
import { compileSource, type Diagnostic } from "../lang/index";
import type { FunctionSpec } from "../logic/index";
import { LimitError, minimize, type MinimizeOptions, type MinimizeResult } from "../minimize/index";
import { BUILT_IN_FAMILIES, type Family } from "../families/index";
import { mapCovers, MapError, type MapResult, type VerifyResult, type Netlist } from "../map/index";
import { analyse, type Analysis } from "../analysis/index";
import { toCsv, toJsonDocument, toVerilog, toVhdl, type NetlistDocument } from "../export/index";
import { DEFAULT_SETTINGS, type DesignSettings } from "./settings";

export * from "./settings";

export type ExportFormat = "verilog" | "vhdl" | "csv" | "json";

export interface PipelineOptions {
  /** User families that settings.familyId may name, searched before the built-ins. */
  families?: readonly Family[];
  /** Exports to render; default none. */
  exports?: ExportFormat[];
  /** Module/entity name for Verilog and VHDL; default "design_top". */
  unitName?: string;
  /** Options passed to the minimizer (time limit, prime limit). */
  minimize?: Pick<MinimizeOptions, "maxPrimes" | "timeLimitMs">;
}

export interface PipelineError {
  code: "language" | "family" | "limit" | "mapping";
  message: string;
}

export interface PipelineResult {
  ok: boolean;
  diagnostics: Diagnostic[];
  spec: FunctionSpec | null;
  minimized: MinimizeResult | null;
  netlist: Netlist | null;
  analysis: Analysis | null;
  verification: VerifyResult | null;
  warnings: string[];
  exports?: Partial<Record<ExportFormat, string>>;
  /** The JSON netlist document (always present when mapping succeeded). */
  document?: NetlistDocument;
  error?: PipelineError;
  family?: Family;
}

/** The family named by id among the user's families and the built-ins. */
export function resolveFamily(id: string, families: readonly Family[] = []): Family | undefined {
  return families.find((f) => f.id === id) ?? BUILT_IN_FAMILIES.find((f) => f.id === id);
}

/** Minimizer options for the settings (form from the gate form, cost model). */
export function minimizeOptionsFor(settings: DesignSettings, family: Family): MinimizeOptions {
  const form = settings.form ?? DEFAULT_SETTINGS.form;
  const cost = settings.cost ?? DEFAULT_SETTINGS.cost;
  const fanIn = settings.fanIn ?? family.fanIn ?? widest(family);
  return {
    form: form === "or-and" || form === "nor" ? "pos" : "sop",
    cost: cost === "fan-in" ? { kind: "fan-in", fanIn: Math.max(2, fanIn) } : { kind: cost },
    heuristic: settings.heuristic ?? false,
  };
}

function widest(f: Family): number {
  const ws = (f.gates ?? []).filter((g) => g.type !== "NOT" && g.type !== "BUF").flatMap((g) => g.widths.map((w) => w.width));
  return ws.length ? Math.max(...ws) : 4;
}

function empty(diagnostics: Diagnostic[], spec: FunctionSpec | null, error: PipelineError): PipelineResult {
  return { ok: false, diagnostics, spec, minimized: null, netlist: null, analysis: null, verification: null, warnings: [], error };
}

/** Runs compile → minimize → map → analyse → verify (→ exports). */
export function compileDesign(source: string, settings: DesignSettings, opts: PipelineOptions = {}): PipelineResult {
  const compiled = compileSource(source);
  if (!compiled.spec) {
    return empty(compiled.diagnostics, null, { code: "language", message: "the design has errors; see the diagnostics" });
  }
  const family = resolveFamily(settings.familyId, opts.families);
  if (!family) return empty(compiled.diagnostics, compiled.spec, familyError(settings.familyId, opts.families));
  let minimized: MinimizeResult;
  try {
    minimized = minimize(compiled.spec, { ...minimizeOptionsFor(settings, family), ...opts.minimize });
  } catch (e) {
    if (e instanceof LimitError) return empty(compiled.diagnostics, compiled.spec, { code: "limit", message: e.message });
    throw e;
  }
  return finish(compiled.diagnostics, compiled.spec, minimized, family, settings, opts);
}

/** Maps, analyses and exports an already minimized design (shared by the sync and worker variants). */
export function finish(
  diagnostics: Diagnostic[],
  spec: FunctionSpec,
  minimized: MinimizeResult,
  family: Family,
  settings: DesignSettings,
  opts: PipelineOptions = {},
): PipelineResult {
  let mapped: MapResult;
  try {
    mapped = mapCovers(minimized, family, {
      form: settings.form ?? DEFAULT_SETTINGS.form,
      ...(settings.fanIn !== undefined ? { fanIn: settings.fanIn } : {}),
      ...(settings.fanOut !== undefined ? { fanOut: settings.fanOut } : {}),
      complementedInputs: settings.complementedInputs ?? DEFAULT_SETTINGS.complementedInputs,
      outputPinLoad: settings.outputPinLoad ?? DEFAULT_SETTINGS.outputPinLoad,
      spec,
    });
  } catch (e) {
    if (e instanceof MapError) return { ...empty(diagnostics, spec, { code: "mapping", message: e.message }), minimized, family };
    throw e;
  }
  const analysis = analyse(mapped.netlist, mapped.family, {
    fanOut: mapped.fanOut,
    outputPinLoad: mapped.outputPinLoad,
    clockMHz: settings.clockMHz ?? DEFAULT_SETTINGS.clockMHz,
    activity: settings.activity ?? DEFAULT_SETTINGS.activity,
  });
  const warnings = [...mapped.warnings, ...analysis.warnings];
  const document = toJsonDocument(mapped.netlist, analysis, warnings);
  const header = [`Fanbound netlist, family ${family.name} (${family.id}), form ${mapped.form}`];
  const exports: Partial<Record<ExportFormat, string>> = {};
  for (const f of opts.exports ?? []) {
    const hdl = { name: opts.unitName, header };
    exports[f] = f === "verilog" ? toVerilog(mapped.netlist, hdl) : f === "vhdl" ? toVhdl(mapped.netlist, hdl) : f === "csv" ? toCsv(mapped.netlist) : JSON.stringify(document, null, 2);
  }
  return {
    ok: true,
    diagnostics,
    spec,
    minimized,
    netlist: mapped.netlist,
    analysis,
    verification: mapped.verification,
    warnings,
    document,
    family: mapped.family,
    ...(opts.exports?.length ? { exports } : {}),
  };
}

export function familyError(id: string, families: readonly Family[] = []): PipelineError {
  const ids = [...families.map((f) => f.id), ...BUILT_IN_FAMILIES.map((f) => f.id)];
  return { code: "family", message: `unknown family "${id}"; the families are: ${ids.join(", ")}` };
}
