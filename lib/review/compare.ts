/**
 * Two sides' figures set against each other: signed deltas (to − from) with
 * the direction of each change, the outputs' covers, the family and the
 * settings that changed, and the netlist's gates by type and width, added and
 * removed. Every figure here is "less is better": fewer gates, levels,
 * packages, transistors, terms and literals, a shorter delay, less power, a
 * lighter heaviest load relative to its limit. That is the reviewer's usual
 * reading (common practice, no source); the page shows the numbers as well,
 * so a reader who wants a trade-off sees it.
 */
import type { NetlistDocument } from "../export/json";
import type { Figures, OutputFigures } from "./figures";

export type Direction = "better" | "worse" | "same" | "mixed" | "unknown";

/** The numeric figures compared row by row, in the order the page shows them. */
export const FIGURE_KEYS = ["gates", "depth", "packages", "transistors", "delayNs", "staticMw", "dynamicMw", "products", "literals"] as const;
export type FigureKey = (typeof FIGURE_KEYS)[number];

export interface FigureRow {
  key: FigureKey;
  from: number | null;
  to: number | null;
  /** to − from; null when either side lacks the figure. */
  delta: number | null;
  direction: Direction;
}

export interface LoadSide {
  load: number;
  limit: number | null;
  /** The load exceeds the limit. */
  over: boolean;
}

export interface LoadRow {
  from: LoadSide;
  to: LoadSide;
  delta: number;
  /** By the share of the limit used when both limits are known, else by the load itself. */
  direction: Direction;
}

export interface OutputRow {
  name: string;
  /** null: the output is not in that side (added or removed), or that side did not record per-output figures. */
  from: OutputFigures | null;
  to: OutputFigures | null;
  delta: { products: number; literals: number } | null;
  direction: Direction;
}

export interface SettingChange {
  key: string;
  /** undefined: the family's default applied. */
  from: unknown;
  to: unknown;
}

export interface NetlistRow {
  type: string;
  width: number;
  from: number;
  to: number;
  added: number;
  removed: number;
}

export interface Comparison {
  figures: FigureRow[];
  load: LoadRow;
  exact: { from: boolean; to: boolean; direction: Direction };
  /** null when neither side recorded per-output figures. */
  outputs: OutputRow[] | null;
  /** Which sides recorded per-output figures (revisions saved before they were kept did not). */
  outputsRecorded: { from: boolean; to: boolean };
  /** Set when the family changed. */
  family: { from: { id: string; name: string }; to: { id: string; name: string } } | null;
  settings: SettingChange[];
  netlist: { rows: NetlistRow[]; added: number; removed: number };
}

/** to − from, rounded to 1e-6 so that stored 3-decimal figures give exact differences; null if either is missing. */
export function delta(from: number | null | undefined, to: number | null | undefined): number | null {
  if (from == null || to == null) return null;
  return Math.round((to - from) * 1e6) / 1e6;
}

/** Direction of a change in a less-is-better figure. */
export function directionOf(d: number | null): Direction {
  if (d === null) return "unknown";
  return d < 0 ? "better" : d > 0 ? "worse" : "same";
}

function combine(ds: Direction[]): Direction {
  const set = new Set(ds.filter((d) => d !== "same"));
  if (set.has("unknown")) return "unknown";
  if (set.size === 0) return "same";
  if (set.size === 1) return [...set][0]!;
  return "mixed";
}

function loadSide(f: Figures): LoadSide {
  return { load: f.maxLoad, limit: f.fanOut, over: f.fanOut !== null && f.maxLoad > f.fanOut + 1e-9 };
}

function outputRows(a: Figures, b: Figures): OutputRow[] | null {
  if (!a.outputs && !b.outputs) return null;
  const names = [...(b.outputs ?? []).map((o) => o.name)];
  for (const o of a.outputs ?? []) if (!names.includes(o.name)) names.push(o.name);
  return names.map((name) => {
    const from = a.outputs?.find((o) => o.name === name) ?? null;
    const to = b.outputs?.find((o) => o.name === name) ?? null;
    if (!from || !to) return { name, from, to, delta: null, direction: "unknown" as Direction };
    const d = { products: to.products - from.products, literals: to.literals - from.literals };
    return { name, from, to, delta: d, direction: combine([directionOf(d.products), directionOf(d.literals)]) };
  });
}

const SETTING_ORDER = ["form", "cost", "fanIn", "fanOut", "complementedInputs", "outputPinLoad", "clockMHz", "activity", "heuristic", "spareInverters", "structure", "aim"];

/** Settings whose value differs between the sides, in a fixed order (unknown keys after, by name). */
export function settingChanges(a: Record<string, unknown>, b: Record<string, unknown>): SettingChange[] {
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => k !== "familyId");
  const rank = (k: string) => (SETTING_ORDER.includes(k) ? SETTING_ORDER.indexOf(k) : SETTING_ORDER.length);
  keys.sort((x, y) => rank(x) - rank(y) || (x < y ? -1 : 1));
  return keys.filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k])).map((k) => ({ key: k, from: a[k], to: b[k] }));
}

/** Gates by type and width on each side, with how many were added and removed. */
export function netlistChange(a: Figures, b: Figures): Comparison["netlist"] {
  const rows = new Map<string, NetlistRow>();
  const row = (type: string, width: number) => {
    const k = `${type}/${width}`;
    let r = rows.get(k);
    if (!r) rows.set(k, (r = { type, width, from: 0, to: 0, added: 0, removed: 0 }));
    return r;
  };
  for (const t of a.byTypeWidth) row(t.type, t.width).from += t.count;
  for (const t of b.byTypeWidth) row(t.type, t.width).to += t.count;
  const list = [...rows.values()].sort((x, y) => (x.type === y.type ? x.width - y.width : x.type < y.type ? -1 : 1));
  for (const r of list) {
    r.added = Math.max(0, r.to - r.from);
    r.removed = Math.max(0, r.from - r.to);
  }
  return { rows: list, added: list.reduce((s, r) => s + r.added, 0), removed: list.reduce((s, r) => s + r.removed, 0) };
}

/** Sets the figures of `to` against those of `from`. */
export function compareFigures(from: Figures, to: Figures): Comparison {
  const figures = FIGURE_KEYS.map((key): FigureRow => {
    const d = delta(from[key], to[key]);
    return { key, from: from[key], to: to[key], delta: d, direction: directionOf(d) };
  });
  const lf = loadSide(from);
  const lt = loadSide(to);
  const share = lf.limit && lt.limit ? delta(lf.load / lf.limit, lt.load / lt.limit) : delta(lf.load, lt.load);
  const exactDir: Direction = from.exact === to.exact ? "same" : to.exact ? "better" : "worse";
  return {
    figures,
    load: { from: lf, to: lt, delta: delta(lf.load, lt.load)!, direction: lf.over !== lt.over ? (lt.over ? "worse" : "better") : directionOf(share) },
    exact: { from: from.exact, to: to.exact, direction: exactDir },
    outputs: outputRows(from, to),
    outputsRecorded: { from: from.outputs !== null, to: to.outputs !== null },
    family: from.family.id === to.family.id ? null : { from: from.family, to: to.family },
    settings: settingChanges(from.settings, to.settings),
    netlist: netlistChange(from, to),
  };
}

/** The figures `map --format json` prints in its `stats`. */
export type MapStats = NetlistDocument["stats"];

/** The deltas the CLI's `compare` prints: to − from of the map stats, with the delay named as elsewhere. */
export function mapStatsDelta(from: MapStats, to: MapStats) {
  return {
    gates: delta(from.gates, to.gates),
    depth: delta(from.depth, to.depth),
    packages: delta(from.packages, to.packages),
    transistors: delta(from.transistors, to.transistors),
    delayNs: delta(from.criticalPathNs, to.criticalPathNs),
    staticMw: delta(from.staticMw, to.staticMw),
    dynamicMw: delta(from.dynamicMw, to.dynamicMw),
  };
}
