/**
 * The figures a reviewer weighs, for one side of a comparison: a saved
 * revision (read from the stats and netlist stored with it) or the unsaved
 * draft (from the compile response). Both arrive in the same shapes — the
 * stored stats are `revisionStats` of the run that saved them — so this module
 * only gathers them; it never runs the pipeline.
 */
import type { GateType } from "../map/netlist";

/** One output's two-level cover. */
export interface OutputFigures {
  name: string;
  /** Product (or, in POS form, sum) terms of this output's cover. */
  products: number;
  literals: number;
  /** The cover is a proven minimum (false: the heuristic's, with a lower bound). */
  exact: boolean;
}

/** Gates of one type and input width. */
export interface TypeWidthCount {
  type: GateType;
  width: number;
  count: number;
}

export interface Figures {
  gates: number;
  /** Gate levels on the longest input-to-output path. */
  depth: number;
  packages: number | null;
  transistors: number | null;
  /** Estimated critical path delay, ns. */
  delayNs: number | null;
  /** Estimated static power, mW. */
  staticMw: number | null;
  /** Estimated dynamic power, mW. */
  dynamicMw: number | null;
  /** Heaviest net load, unit loads. */
  maxLoad: number;
  /** The fan-out limit that load is held against, unit loads; null when the saved figures did not record it. */
  fanOut: number | null;
  /** Distinct terms of the whole cover. */
  products: number;
  literals: number;
  exact: boolean;
  /** Per output; null for revisions saved before per-output figures were kept. */
  outputs: OutputFigures[] | null;
  /** Gate counts by type and width, from the netlist. */
  byTypeWidth: TypeWidthCount[];
  family: { id: string; name: string };
  /** Design settings apart from the family (form, cost model, fan-in, fan-out, ...). */
  settings: Record<string, unknown>;
}

/** The parts of a netlist document this module reads (the stored one or the compile response's). */
export interface GateList {
  gates: { type: GateType; inputs: string[] }[];
}

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

/** Gate counts by type and width, ordered by type then width. */
export function countByTypeWidth(netlist: GateList | null | undefined): TypeWidthCount[] {
  const m = new Map<string, TypeWidthCount>();
  for (const g of netlist?.gates ?? []) {
    const key = `${g.type}/${g.inputs.length}`;
    const row = m.get(key) ?? { type: g.type, width: g.inputs.length, count: 0 };
    row.count++;
    m.set(key, row);
  }
  return [...m.values()].sort((a, b) => (a.type === b.type ? a.width - b.width : a.type < b.type ? -1 : 1));
}

function outputsOf(v: unknown): OutputFigures[] | null {
  if (!Array.isArray(v)) return null;
  return v.map((o: Record<string, unknown>) => ({
    name: String(o.name),
    products: num(o.products) ?? 0,
    literals: num(o.literals) ?? 0,
    exact: o.exact === true,
  }));
}

/**
 * Figures from stored (or just computed) revision stats, the netlist document
 * and the family and settings of the run. `fanOutFallback` is used when the
 * stats do not carry the limit (rows saved before it was kept).
 */
export function figuresOf(p: {
  stats: Record<string, unknown>;
  netlist: GateList | null | undefined;
  family: { id: string; name: string };
  settings: Record<string, unknown>;
  fanOutFallback?: number | null;
}): Figures {
  const s = p.stats;
  const { familyId: _ignored, ...settings } = p.settings;
  return {
    gates: num(s.gates) ?? 0,
    depth: num(s.depth) ?? 0,
    packages: num(s.packages),
    transistors: num(s.transistors),
    delayNs: num(s.delayNs),
    staticMw: num(s.staticMw),
    dynamicMw: num(s.dynamicMw),
    maxLoad: num(s.maxLoad) ?? 0,
    fanOut: num(s.fanOut) ?? p.fanOutFallback ?? null,
    products: num(s.products) ?? 0,
    literals: num(s.literals) ?? 0,
    exact: s.exact === true,
    outputs: outputsOf(s.byOutput),
    byTypeWidth: countByTypeWidth(p.netlist),
    family: p.family,
    settings,
  };
}
