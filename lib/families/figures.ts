/**
 * What each family figure is: its symbol, its unit and the range a value must
 * lie in. The validator, the family editor and the API's error messages all
 * read this one table, so a figure is described the same way everywhere.
 *
 * The ranges are wide on purpose — they catch a value typed in the wrong unit
 * (mA for µA, V for mV), not an unusual family. Common practice, no source.
 */
import type { FigureKey } from "./types";

export type FigureGroup = "supply" | "levels" | "currents" | "edges" | "delay" | "power";

export interface FigureSpec {
  key: FigureKey;
  /** The trade's symbol, e.g. "VOH(min)". */
  symbol: string;
  /** What the figure means, in a few words. */
  label: string;
  unit: "V" | "mA" | "pF" | "Ω" | "ns";
  /** Smallest and largest allowed value (for currents: of the magnitude; the sign is ignored). */
  min: number;
  max: number;
  /** The minimum itself is not allowed (a figure that must be greater than 0). */
  minExclusive?: boolean;
  /** A current: its sign says only its direction, the formulas use |x|. */
  signed?: boolean;
  group: FigureGroup;
}

export const FIGURES: readonly FigureSpec[] = [
  { key: "supplyV", symbol: "VCC", label: "supply voltage", unit: "V", min: 0, max: 30, minExclusive: true, group: "supply" },
  { key: "vohMin", symbol: "VOH(min)", label: "lowest guaranteed output high level", unit: "V", min: 0, max: 30, group: "levels" },
  { key: "volMax", symbol: "VOL(max)", label: "highest guaranteed output low level", unit: "V", min: 0, max: 30, group: "levels" },
  { key: "vihMin", symbol: "VIH(min)", label: "lowest input level read as high", unit: "V", min: 0, max: 30, group: "levels" },
  { key: "vilMax", symbol: "VIL(max)", label: "highest input level read as low", unit: "V", min: 0, max: 30, group: "levels" },
  { key: "inputMaxV", symbol: "VI(max)", label: "highest voltage an input tolerates", unit: "V", min: 0, max: 30, minExclusive: true, group: "levels" },
  { key: "iohMa", symbol: "IOH", label: "output high current at which VOH(min) holds", unit: "mA", min: 0.000001, max: 1000, signed: true, group: "currents" },
  { key: "iolMa", symbol: "IOL", label: "output low current at which VOL(max) holds", unit: "mA", min: 0.000001, max: 1000, signed: true, group: "currents" },
  { key: "iihMa", symbol: "IIH", label: "input current at a high level", unit: "mA", min: 0.000001, max: 1000, signed: true, group: "currents" },
  { key: "iilMa", symbol: "IIL", label: "input current at a low level", unit: "mA", min: 0.000001, max: 1000, signed: true, group: "currents" },
  { key: "inputCapPf", symbol: "C_in", label: "capacitance of one input (one unit load)", unit: "pF", min: 0, max: 10000, minExclusive: true, group: "edges" },
  { key: "outputOhms", symbol: "R_out", label: "output resistance for edge-rate estimates", unit: "Ω", min: 0, max: 1000000, minExclusive: true, group: "edges" },
  { key: "maxTransitionNs", symbol: "t_max", label: "longest input rise or fall time allowed", unit: "ns", min: 0, max: 1000000, minExclusive: true, group: "edges" },
  { key: "wiringPf", symbol: "C_wire", label: "wiring capacitance per net", unit: "pF", min: 0, max: 10000, group: "edges" },
  { key: "intrinsicNs", symbol: "t_intrinsic", label: "propagation delay of one gate", unit: "ns", min: 0, max: 1000000, minExclusive: true, group: "delay" },
  { key: "perLoadNs", symbol: "k_load", label: "added delay per unit load driven", unit: "ns", min: 0, max: 10000, group: "delay" },
  { key: "staticMaPerGate", symbol: "I_static", label: "supply current per gate holding a level", unit: "mA", min: 0, max: 1000, group: "power" },
  { key: "powerCapPf", symbol: "C_pd", label: "internal power-dissipation capacitance per gate", unit: "pF", min: 0, max: 10000, group: "power" },
  { key: "ttlHighInputMa", symbol: "ΔI_CC", label: "extra supply current per input held at a TTL high", unit: "mA", min: 0, max: 100, group: "power" },
];

/** The spec of one figure. */
export function figureSpec(key: FigureKey): FigureSpec {
  return FIGURES.find((f) => f.key === key)!;
}

/** "from 0 to 30 V" / "above 0 and at most 30 V", said the way the validator and the editor say it. */
export function rangeText(spec: Pick<FigureSpec, "min" | "max" | "minExclusive" | "unit" | "signed">): string {
  // 1000000 reads as "1 000 000"; small figures as typed ("0.000001").
  const n = (x: number) => (Math.abs(x) >= 1e4 ? String(x).replace(/\B(?=(\d{3})+(?!\d))/g, " ") : String(x));
  const core = spec.minExclusive ? `above ${n(spec.min)} and at most ${n(spec.max)} ${spec.unit}` : `from ${n(spec.min)} to ${n(spec.max)} ${spec.unit}`;
  return spec.signed ? `${core} in magnitude (the sign gives only the direction)` : core;
}

/** Source notes offered in the editor; any text is allowed. */
export const SOURCE_SUGGESTIONS = ["data sheet of part …", "measured", "estimate", "from memory", "handbook table"] as const;
