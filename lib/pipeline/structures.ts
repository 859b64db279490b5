/**
 * Two-level and factored structures side by side. The two-level mapping is
 * always made; the factored one (lib/factor) when the settings keep it or
 * the caller asks to compare. The figures of both — gates, levels,
 * packages, transistors, delay and power — come back together, so the
 * designer can see what factoring buys and pick which the revision keeps
 * (`settings.structure`).
 */
import type { FunctionSpec } from "../logic/index";
import type { MinimizeResult } from "../minimize/index";
import type { Family } from "../families/index";
import type { MapOptions, MapResult } from "../map/index";
import { mapFactored, type FactorResult, type Structure as FactoredForm } from "../factor/index";
import type { Analysis } from "../analysis/index";
import type { ResolvedSettings, Structure } from "./settings";

/** Figures of one structure. Delay and power are estimates (see Analysis.caution). */
export interface StructureFigures {
  structure: Structure;
  /** The structure the revision keeps (the pipeline's netlist, analysis and exports). */
  kept: boolean;
  /** For the factored structure: which construction the multi-level stage kept ("two-level" when nothing it built was better). */
  built?: FactoredForm;
  gates: number;
  levels: number;
  packages: number | null;
  transistors: number | null;
  delayNs: number | null;
  staticMw: number | null;
  dynamicMw: number | null;
  verified: boolean;
}

export interface StructureChoice {
  mapped: MapResult;
  analysis: Analysis;
  /** The two-level structure's figures, then the factored one's when it was built. */
  structures: StructureFigures[];
  /** For the factored structure: the construction kept. */
  built?: FactoredForm;
}

function figures(structure: Structure, kept: boolean, m: MapResult, a: Analysis, built?: FactoredForm): StructureFigures {
  return {
    structure,
    kept,
    ...(built ? { built } : {}),
    gates: a.gates,
    levels: a.depth,
    packages: a.packages,
    transistors: a.transistors,
    delayNs: a.criticalPath.delay.value,
    staticMw: a.staticPower.value,
    dynamicMw: a.dynamicPower.value,
    verified: m.verification?.ok ?? false,
  };
}

/**
 * The structure the settings keep, with both structures' figures when the
 * factored one is built (settings.structure "factored", or `compare`).
 * `twoLevel` is the two-level mapping made with `mapOptions`; `analyse`
 * analyses a mapping with the design's electrical settings.
 */
export function chooseStructure(
  spec: FunctionSpec,
  minimized: MinimizeResult,
  family: Family,
  settings: ResolvedSettings,
  mapOptions: MapOptions,
  twoLevel: MapResult,
  analyse: (m: MapResult) => Analysis,
  compare = false,
  onStage?: (stage: "factor" | "analyse") => void,
): StructureChoice {
  const keep = settings.structure;
  let f: FactorResult | null = null;
  if (keep === "factored" || compare) {
    onStage?.("factor");
    f = mapFactored(spec, minimized, family, { ...mapOptions, aim: settings.aim, twoLevel });
  }
  onStage?.("analyse");
  const twoLevelAnalysis = analyse(twoLevel);
  if (!f) return { mapped: twoLevel, analysis: twoLevelAnalysis, structures: [figures("two-level", true, twoLevel, twoLevelAnalysis)] };
  const factoredAnalysis = f.mapped === twoLevel ? twoLevelAnalysis : analyse(f.mapped);
  const structures = [
    figures("two-level", keep === "two-level", twoLevel, twoLevelAnalysis),
    figures("factored", keep === "factored", f.mapped, factoredAnalysis, f.structure),
  ];
  return keep === "factored"
    ? { mapped: f.mapped, analysis: factoredAnalysis, structures, built: f.structure }
    : { mapped: twoLevel, analysis: twoLevelAnalysis, structures };
}
