/** Labels, number formats and colours of the compare view and the reviews. */
import type { Direction, FigureKey } from "@/lib/review";
import type { ReviewState } from "@/lib/client/types";
import { fmtMw, fmtNs } from "@/components/workspace/format";

export const FIGURE_LABELS: Record<FigureKey, { label: string; estimate?: boolean }> = {
  gates: { label: "Gates" },
  depth: { label: "Gate levels (depth)" },
  packages: { label: "Packages" },
  transistors: { label: "Transistors" },
  delayNs: { label: "Critical path delay", estimate: true },
  staticMw: { label: "Static power", estimate: true },
  dynamicMw: { label: "Dynamic power", estimate: true },
  products: { label: "Product terms" },
  literals: { label: "Literals" },
};

export type PowerUnit = "µW" | "mW";

/** One unit for a row of power figures (both sides and the change), so they read alike: µW when all are under 1 mW. */
export function powerUnit(...mw: Array<number | null>): PowerUnit {
  return Math.max(0, ...mw.map((v) => Math.abs(v ?? 0))) < 1 ? "µW" : "mW";
}

function fmtPower(mw: number, unit: PowerUnit): string {
  const v = unit === "µW" ? mw * 1000 : mw;
  return unit === "µW" ? `${v.toFixed(v < 100 ? 1 : 0)} µW` : `${v.toFixed(v < 10 ? 2 : 1)} mW`;
}

/** A figure as the compare table shows it; power in `unit` when given (see {@link powerUnit}). */
export function fmtFigure(key: FigureKey, v: number | null, unit?: PowerUnit): string {
  if (v === null) return "—";
  if (key === "delayNs") return fmtNs(v);
  if (key === "staticMw" || key === "dynamicMw") return unit ? fmtPower(v, unit) : fmtMw(v);
  return String(v);
}

const MINUS = "\u2212";

/** A signed change: "+2", "−1.3 ns", "±0". */
export function fmtDelta(key: FigureKey | "load", d: number | null, unit?: PowerUnit): string {
  if (d === null) return "—";
  if (d === 0) return "±0";
  const sign = d > 0 ? "+" : MINUS;
  const a = Math.abs(d);
  if (key === "delayNs") return `${sign}${fmtNs(a)}`;
  if (key === "staticMw" || key === "dynamicMw") return `${sign}${unit ? fmtPower(a, unit) : fmtMw(a)}`;
  return `${sign}${Number.isInteger(a) ? a : a.toFixed(2)}`;
}

/** Text colour of a change: the accent green for better, vermilion for worse. */
export function directionClass(d: Direction): string {
  return d === "better" ? "text-accent" : d === "worse" ? "text-vermilion" : d === "mixed" ? "text-amber" : "text-graphite";
}

export const DIRECTION_WORDS: Record<Direction, string> = {
  better: "better",
  worse: "worse",
  same: "unchanged",
  mixed: "some better, some worse",
  unknown: "not comparable",
};

export const STATE_LABELS: Record<ReviewState, string> = {
  open: "open",
  approved: "approved",
  "changes-asked": "changes asked",
  withdrawn: "withdrawn",
  superseded: "superseded",
};

export function stateClass(s: ReviewState): string {
  switch (s) {
    case "approved":
      return "border-accent/60 bg-accent/10 text-accent";
    case "changes-asked":
      return "border-vermilion/60 bg-vermilion/10 text-vermilion";
    case "open":
      return "border-amber/60 bg-amber/10 text-amber";
    default:
      return "border-rule text-graphite";
  }
}

/** A setting's value as the page names it; undefined means the default applied (the family's, or the product's). */
export function fmtSetting(v: unknown): string {
  if (v === undefined || v === null) return "default";
  if (typeof v === "boolean") return v ? "yes" : "no";
  return String(v);
}

export const SETTING_LABELS: Record<string, string> = {
  form: "Gate form",
  cost: "Cost model",
  fanIn: "Fan-in",
  fanOut: "Fan-out",
  complementedInputs: "Complemented inputs",
  outputPinLoad: "Output pin load",
  clockMHz: "Clock (MHz)",
  activity: "Activity",
  heuristic: "Heuristic minimizer",
  spareInverters: "Spare gates as inverters",
  structure: "Structure kept (two-level or factored)",
  aim: "Factoring aims at (gates or levels)",
};

export function fmtStamp(iso: string): string {
  return new Date(iso).toISOString().slice(0, 16).replace("T", " ");
}
