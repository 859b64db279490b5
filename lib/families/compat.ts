/**
 * Where two families meet: may a driver family's output feed a receiver
 * family's inputs, with what noise margins, and how many of them? Pure
 * arithmetic on the two families' figures, each result with its formula.
 *
 *   NMH = VOH(min) of the driver − VIH(min) of the receiver
 *   NML = VIL(max) of the receiver − VOL(max) of the driver
 *   inputs fed, high state = floor(|IOH| / IIH), low state = floor(IOL / |IIL|)
 *   inputs fed by the edge-rate limit = floor((t_max / (2.2·R_out) − C_wire) / C_in)
 */
import type { Family } from "./types";
import {
  acFanOutFigure,
  dcFanOutHighFigure,
  dcFanOutLowFigure,
  fmtFigure,
  missingFigure,
  roundFigure,
  type DerivedFigure,
} from "./derive";

/**
 * compatible — levels meet with margins of at least SMALL_MARGIN_V and one
 * output feeds at least one input; small-margin — they meet, but a margin is
 * thinner than that; not-compatible — a level is missed, one output cannot
 * feed a single input, or the driver's swing exceeds what the inputs
 * tolerate; unknown — the figures needed are missing.
 */
export type Verdict = "compatible" | "small-margin" | "not-compatible" | "unknown";

/**
 * A guaranteed noise margin below this is called small: 0.3 V, the low-state
 * margin the low-power Schottky TTL line guarantees against itself (0.8 − 0.5
 * V), is still taken as enough. Common practice, no source.
 */
export const SMALL_MARGIN_V = 0.3;

export interface Compatibility {
  /** true / false when the levels are known, null when the figures are missing. */
  compatible: boolean | null;
  highOk: boolean | null;
  lowOk: boolean | null;
  /** Margins at the interface: driver VOH(min) − receiver VIH(min), receiver VIL(max) − driver VOL(max). */
  nmh: DerivedFigure;
  nml: DerivedFigure;
  /** Receiver inputs one output may hold high: floor(|IOH| / IIH). */
  fanOutHigh: DerivedFigure;
  /** Receiver inputs one output may hold low: floor(IOL / |IIL|). */
  fanOutLow: DerivedFigure;
  /** Receiver inputs one output may charge within the receiver's transition-time limit. */
  fanOutAc: DerivedFigure;
  /** How many receiver inputs one driver output may feed (the least of the three limits), null when not known. */
  receivers: DerivedFigure;
  /**
   * false when the driver is CMOS (its high level reaches its supply) and its
   * supply exceeds the highest voltage the receiver's inputs tolerate; null
   * when not checked.
   */
  inputTolerated: boolean | null;
  /** Which output operating point the figures use. */
  point: "light" | "rated" | null;
  verdict: Verdict;
  /** Plain sentences: what is wrong or missing, and what to do. */
  messages: string[];
}

interface Point {
  name: "light" | "rated";
  voh?: number;
  vol?: number;
  ioh?: number;
  iol?: number;
}

/**
 * Whether a driver family's output levels satisfy a receiver family's input
 * thresholds, and how many receiver inputs one driver output may feed. When
 * the driver gives a heavier rated point as well, the check uses the light
 * point if its levels pass and its current feeds at least one receiver, and
 * the rated point otherwise.
 */
export function compatibility(driver: Family, receiver: Family): Compatibility {
  const points: Point[] = [{ name: "light", voh: driver.vohMin, vol: driver.volMax, ioh: driver.iohMa, iol: driver.iolMa }];
  if (driver.ratedDrive) {
    const r = driver.ratedDrive;
    points.push({ name: "rated", voh: r.vohMin, vol: r.volMax, ioh: r.iohMa, iol: r.iolMa });
  }
  type AtPoint = ReturnType<typeof atPoint>;
  let best: AtPoint | null = null;
  let bestPoint = points[0]!;
  for (const p of points) {
    const c = atPoint(p, driver, receiver);
    if (best === null) best = c;
    if (c.compatible === true && (c.receivers.value ?? 1) >= 1) {
      best = c;
      bestPoint = p;
      break;
    }
  }
  const c = best!;
  const pt = bestPoint;
  const messages: string[] = [];
  if (c.highOk === false) {
    // A pull-up lifts a totem-pole bipolar output; a CMOS push-pull output would be back-driven through its clamp diodes.
    const fix =
      driver.technology === "bipolar"
        ? "add a pull-up resistor to the receiver's supply, or choose a receiver family with TTL-level inputs"
        : "choose a receiver family with TTL-level inputs, or put a level translator between them";
    messages.push(`${driver.name} guarantees a high of only ${pt.voh} V, below the ${receiver.vihMin} V that ${receiver.name} needs to read a high: ${fix}`);
  }
  if (c.lowOk === false) {
    messages.push(`${driver.name} may drive a low of up to ${pt.vol} V, above the ${receiver.vilMax} V that ${receiver.name} reads as low: put a level translator between them`);
  }
  if (c.inputTolerated === false) {
    messages.push(
      `${driver.name} swings up to its ${driver.supplyV} V supply, above the ${receiver.inputMaxV} V that ${receiver.name}'s inputs tolerate: ` +
        "put a level translator between them, or choose receivers with tolerant inputs",
    );
  }
  if (c.compatible === null) messages.push("levels not checked: the driver's output levels or the receiver's input thresholds are missing");
  if (c.compatible === true && c.receivers.value === 0) {
    const which = c.fanOutLow.value === 0 ? "low" : c.fanOutHigh.value === 0 ? "high" : "edge-rate";
    messages.push(`one ${driver.name} output cannot feed even one ${receiver.name} input (${which} limit): use a buffer with more drive`);
  }
  if (c.receivers.missing && c.compatible !== false) messages.push(`receivers per output not estimated: ${c.receivers.missing}`);
  const margin = Math.min(c.nmh.value ?? Infinity, c.nml.value ?? Infinity);
  let verdict: Verdict;
  if (c.compatible === false || c.inputTolerated === false || c.receivers.value === 0) verdict = "not-compatible";
  else if (c.compatible === null) verdict = "unknown";
  else if (margin < SMALL_MARGIN_V - 1e-9) {
    verdict = "small-margin";
    messages.push(`a noise margin of ${fmtFigure(margin)} V is below ${SMALL_MARGIN_V} V: keep the connection short and quiet, or choose families with wider margins`);
  } else verdict = "compatible";
  return { ...c, verdict, messages };
}

function atPoint(p: Point, driver: Family, receiver: Family): Omit<Compatibility, "verdict" | "messages"> {
  const highOk = p.voh !== undefined && receiver.vihMin !== undefined ? p.voh >= receiver.vihMin - 1e-9 : null;
  const lowOk = p.vol !== undefined && receiver.vilMax !== undefined ? p.vol <= receiver.vilMax + 1e-9 : null;
  const compatible = highOk === null || lowOk === null ? null : highOk && lowOk;
  const nmh: DerivedFigure =
    p.voh !== undefined && receiver.vihMin !== undefined
      ? {
          value: roundFigure(p.voh - receiver.vihMin),
          unit: "V",
          formula: `NMH = VOH(min) − VIH(min) = ${fmtFigure(p.voh)} − ${fmtFigure(receiver.vihMin)} = ${fmtFigure(roundFigure(p.voh - receiver.vihMin))} V`,
        }
      : missingFigure("V", "driver VOH(min) and receiver VIH(min) are needed");
  const nml: DerivedFigure =
    p.vol !== undefined && receiver.vilMax !== undefined
      ? {
          value: roundFigure(receiver.vilMax - p.vol),
          unit: "V",
          formula: `NML = VIL(max) − VOL(max) = ${fmtFigure(receiver.vilMax)} − ${fmtFigure(p.vol)} = ${fmtFigure(roundFigure(receiver.vilMax - p.vol))} V`,
        }
      : missingFigure("V", "driver VOL(max) and receiver VIL(max) are needed");
  const fanOutLow = dcFanOutLowFigure(p.iol, receiver.iilMa);
  const fanOutHigh = dcFanOutHighFigure(p.ioh, receiver.iihMa);
  const fanOutAc = acFanOutFigure(driver.outputOhms, receiver.maxTransitionNs, receiver.inputCapPf, receiver.wiringPf ?? driver.wiringPf ?? 0);
  const known = [fanOutLow, fanOutHigh, fanOutAc].filter((f) => f.value !== null);
  const least = known.length ? Math.min(...known.map((f) => f.value!)) : null;
  const receivers: DerivedFigure =
    compatible === false
      ? { value: 0, unit: "receivers", formula: "levels are not compatible" }
      : least === null
        ? missingFigure("receivers", "driver output currents and receiver input currents are needed")
        : { value: least, unit: "receivers", formula: `min(${known.map((f) => f.formula).join("; ")}) = ${least}` };
  const inputTolerated =
    driver.technology === "cmos" && driver.supplyV !== undefined && receiver.inputMaxV !== undefined
      ? driver.supplyV <= receiver.inputMaxV + 1e-9
      : null;
  return { compatible, highOk, lowOk, nmh, nml, fanOutHigh, fanOutLow, fanOutAc, receivers, inputTolerated, point: p.name };
}

/** One driver → receiver cell of the compatibility matrix, with what the detail view shows. */
export interface CompatibilityPair {
  /** Family ids (keys). */
  driver: string;
  receiver: string;
  /** Noise margins, V; null when a level is missing. */
  nmhV: number | null;
  nmlV: number | null;
  /** Receiver inputs one output may feed in the high and the low state (DC currents); null when not known. */
  fanOutHigh: number | null;
  fanOutLow: number | null;
  verdict: Verdict;
  /** Receiver inputs within the receiver's edge-rate limit; null when it gives none. */
  fanOutAc: number | null;
  point: "light" | "rated" | null;
  formulas: { nmh: string; nml: string; fanOutHigh: string; fanOutLow: string; fanOutAc: string };
  messages: string[];
}

/** The matrix cell of one pair. */
export function compatibilityPair(driver: Family, receiver: Family): CompatibilityPair {
  const c = compatibility(driver, receiver);
  return {
    driver: driver.id,
    receiver: receiver.id,
    nmhV: c.nmh.value,
    nmlV: c.nml.value,
    fanOutHigh: c.fanOutHigh.value,
    fanOutLow: c.fanOutLow.value,
    verdict: c.verdict,
    fanOutAc: c.fanOutAc.value,
    point: c.point,
    formulas: { nmh: c.nmh.formula, nml: c.nml.formula, fanOutHigh: c.fanOutHigh.formula, fanOutLow: c.fanOutLow.formula, fanOutAc: c.fanOutAc.formula },
    messages: c.messages,
  };
}

/** Every driver → receiver pair of the given families, a family with itself included (row-major: drivers outer). */
export function compatibilityMatrix(families: readonly Family[]): CompatibilityPair[] {
  const out: CompatibilityPair[] = [];
  for (const d of families) for (const r of families) out.push(compatibilityPair(d, r));
  return out;
}

/** The verdict in words, for tables and warnings. */
export const VERDICT_WORDS: Record<Verdict, string> = {
  compatible: "compatible",
  "small-margin": "compatible with a small margin",
  "not-compatible": "not compatible",
  unknown: "not checked (figures missing)",
};
