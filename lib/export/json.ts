/**
 * The JSON netlist document the CLI prints and the API returns. Its delay,
 * power and load figures are estimates, so the document carries the
 * analysis's caution beside them.
 */
import type { Analysis } from "../analysis/index";
import type { GateType, Netlist } from "../map/netlist";

export interface NetlistDocument {
  inputs: string[];
  complementedInputs?: { input: string; net: string }[];
  outputs: { name: string; net: string }[];
  gates: { id: string; type: GateType; inputs: string[]; output: string }[];
  stats: {
    gates: number;
    byType: Partial<Record<GateType, number>>;
    packages: number | null;
    transistors: number | null;
    depth: number;
    criticalPathNs: number | null;
    staticMw: number | null;
    dynamicMw: number | null;
    maxLoad: number;
  };
  warnings: string[];
  /** Why the stats' delay, power and load figures are estimates only (the analysis's caution text). */
  caution: string;
}

/** Builds the document; `warnings` are the mapper's and the analysis's together. */
export function toJsonDocument(netlist: Netlist, analysis: Analysis, warnings: string[]): NetlistDocument {
  return {
    inputs: netlist.inputs,
    ...(netlist.complements.length ? { complementedInputs: netlist.complements } : {}),
    outputs: netlist.outputs.map((o) => ({ name: o.name, net: o.net })),
    gates: netlist.gates.map((g) => ({ id: g.id, type: g.type, inputs: g.inputs, output: g.output })),
    stats: {
      gates: analysis.gates,
      byType: analysis.byType,
      packages: analysis.packages,
      transistors: analysis.transistors,
      depth: analysis.depth,
      criticalPathNs: analysis.criticalPath.delay.value,
      staticMw: analysis.staticPower.value,
      dynamicMw: analysis.dynamicPower.value,
      maxLoad: analysis.maxLoad,
    },
    warnings,
    caution: analysis.caution,
  };
}
