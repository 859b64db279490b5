/**
 * The figures stored with each revision and shown in the design list: a
 * small, flat summary of one pipeline run, so lists sort and chart without
 * recomputing anything.
 */
import type { FunctionSpec } from "../logic/index";
import type { MinimizeResult } from "../minimize/index";
import type { Analysis } from "../analysis/index";
import type { VerifyResult } from "../map/index";
import type { Structure } from "./settings";

export interface RevisionStats {
  inputs: number;
  outputs: number;
  /** Distinct product (or sum) terms of the two-level cover. */
  products: number;
  literals: number;
  /** Terms shared by more than one output. */
  shared: number;
  /** The cover is a proven minimum under the cost model. */
  exact: boolean;
  /** Cost of the cover and the proven lower bound under the cost model. */
  cost: number;
  lowerBound: number;
  gates: number;
  depth: number;
  /** Estimated critical path delay, ns; null when the family has no delay model. */
  delayNs: number | null;
  packages: number | null;
  transistors: number | null;
  staticMw: number | null;
  dynamicMw: number | null;
  /** Heaviest net load in unit loads. */
  maxLoad: number;
  /** The fan-out limit the netlist was mapped and checked against, unit loads; null when no net was loaded. */
  fanOut: number | null;
  verified: boolean;
  /** Per output: its cover's terms and literals, and whether that cover is a proven minimum. */
  byOutput: { name: string; products: number; literals: number; exact: boolean }[];
  /** The structure the figures (and the netlist) belong to: the two-level covers mapped as they are, or the factored network. */
  structure: Structure;
}

/** The stats of one run. */
export function revisionStats(spec: FunctionSpec, m: MinimizeResult, a: Analysis, verification: VerifyResult | null, structure: Structure = "two-level"): RevisionStats {
  return {
    inputs: spec.inputs.length,
    outputs: spec.outputs.length,
    products: countDistinctTerms(m),
    literals: m.outputs.reduce((s, o) => s + o.literals, 0),
    shared: m.shared,
    exact: m.exact,
    cost: m.cost,
    lowerBound: m.lowerBound,
    gates: a.gates,
    depth: a.depth,
    delayNs: a.criticalPath.delay.value,
    packages: a.packages,
    transistors: a.transistors,
    staticMw: a.staticPower.value,
    dynamicMw: a.dynamicPower.value,
    maxLoad: a.maxLoad,
    // every net is held against the same limit (lib/analysis), so the first row tells it
    fanOut: a.loads[0]?.limit ?? null,
    verified: verification?.ok ?? false,
    byOutput: m.outputs.map((o) => ({ name: o.name, products: o.products, literals: o.literals, exact: o.exact })),
    structure,
  };
}

function countDistinctTerms(m: MinimizeResult): number {
  const seen = new Set<string>();
  for (const o of m.outputs) for (const c of o.cubes) seen.add(`${o.form}:${c.value}:${c.mask}`);
  return seen.size;
}
