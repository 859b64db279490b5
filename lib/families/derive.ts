/**
 * Figures derived from a family's data, each with the formula shown to the
 * user. A figure that cannot be computed from what the family gives has
 * value null and says what is missing.
 */
import type { Family, GateOffer, GateType, GateWidth } from "./types";
import { GATE_TYPES, MAX_GATE_WIDTH } from "./types";

export interface DerivedFigure {
  value: number | null;
  unit: string;
  /** The formula with the family's numbers filled in, or the reason it is missing. */
  formula: string;
  missing?: string;
}

export interface FamilyDerived {
  dcFanOutLow: DerivedFigure;
  dcFanOutHigh: DerivedFigure;
  dcFanOut: DerivedFigure;
  acFanOut: DerivedFigure;
  /** The fan-out the mapper uses: user-set, else min(DC, AC), else whichever is known. */
  fanOut: DerivedFigure;
  /** Widest gate input on offer. */
  fanIn: DerivedFigure;
  nmh: DerivedFigure;
  nml: DerivedFigure;
}

const abs = Math.abs;
const fmt = (x: number) => (Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6))));

/** 10 %–90 % rise time of a single RC stage: t = R·C·ln 9 ≈ 2.2·R·C. R in Ω, C in pF, result in ns. */
export function riseTimeNs(ohms: number, pf: number): number {
  return (2.2 * ohms * pf) / 1000;
}

/** Default fan-out when a family gives neither a user figure nor enough data (unit loads). */
export const DEFAULT_FAN_OUT = 10;
/** Default widest gate when a family gives neither gates nor a fan-in. */
export const DEFAULT_FAN_IN = 4;

function missing(unit: string, what: string): DerivedFigure {
  return { value: null, unit, formula: `not estimated: ${what}`, missing: what };
}

function dcLow(iolMa: number | undefined, iilMa: number | undefined): DerivedFigure {
  if (iolMa === undefined || iilMa === undefined) return missing("unit loads", "IOL and IIL are needed");
  const v = Math.floor(abs(iolMa) / abs(iilMa) + 1e-9);
  return { value: v, unit: "unit loads", formula: `floor(IOL / |IIL|) = floor(${fmt(abs(iolMa))} mA / ${fmt(abs(iilMa))} mA) = ${v}` };
}

function dcHigh(iohMa: number | undefined, iihMa: number | undefined): DerivedFigure {
  if (iohMa === undefined || iihMa === undefined) return missing("unit loads", "IOH and IIH are needed");
  const v = Math.floor(abs(iohMa) / abs(iihMa) + 1e-9);
  return { value: v, unit: "unit loads", formula: `floor(|IOH| / IIH) = floor(${fmt(abs(iohMa))} mA / ${fmt(abs(iihMa))} mA) = ${v}` };
}

/**
 * Receivers a driver's output resistance can charge within the receiver's
 * transition-time limit: n = floor((t_max / (2.2·R) − C_wire) / C_in).
 */
export function acFanOutFigure(
  ohms: number | undefined,
  maxTransitionNs: number | undefined,
  inputCapPf: number | undefined,
  wiringPf = 0,
): DerivedFigure {
  if (maxTransitionNs === undefined) return missing("unit loads", "no transition-time limit given");
  if (ohms === undefined) return missing("unit loads", "output resistance is needed");
  if (inputCapPf === undefined) return missing("unit loads", "input capacitance is needed");
  const cMax = (maxTransitionNs * 1000) / (2.2 * ohms);
  const v = Math.max(0, Math.floor((cMax - wiringPf) / inputCapPf + 1e-9));
  return {
    value: v,
    unit: "unit loads",
    formula: `t ≈ 2.2·R·C with C = n·C_in + C_wire: n = floor((${fmt(maxTransitionNs)} ns / (2.2 · ${fmt(ohms)} Ω) − ${fmt(wiringPf)} pF) / ${fmt(inputCapPf)} pF) = ${v}`,
  };
}

/** Gate offers after applying the user's fan-in cap; defaults to every type at 2..fanIn. */
export function offeredGates(family: Family): GateOffer[] {
  const cap = family.fanIn;
  if (!family.gates || family.gates.length === 0) {
    // validateFamily and the mapper refuse a fan-in above MAX_GATE_WIDTH; the clamp only keeps an unchecked one from building a huge list
    const k = Math.min(cap ?? DEFAULT_FAN_IN, MAX_GATE_WIDTH);
    const widths: GateWidth[] = [];
    for (let n = 2; n <= k; n++) widths.push({ width: n, perPackage: 1 });
    return GATE_TYPES.map((type) =>
      type === "NOT" || type === "BUF"
        ? { type, widths: [{ width: 1, perPackage: 1 }] }
        : type === "XOR" || type === "XNOR"
          ? { type, widths: [{ width: 2, perPackage: 1 }] }
          : { type, widths: widths.slice() },
    );
  }
  return family.gates
    .map((g) => ({
      type: g.type,
      widths: g.widths.filter((x) => cap === undefined || x.width <= cap || x.width === 1).sort((a, b) => a.width - b.width),
    }))
    .filter((g) => g.widths.length > 0);
}

/** Widths offered for a gate type, ascending (empty when the type is not offered). */
export function widthsOf(family: Family, type: GateType): number[] {
  return offeredGates(family).find((g) => g.type === type)?.widths.map((x) => x.width) ?? [];
}

/** Derived figures of a family, each with its formula. */
export function deriveFamily(family: Family): FamilyDerived {
  const lo = dcLow(family.iolMa, family.iilMa);
  const hi = dcHigh(family.iohMa, family.iihMa);
  let dc: DerivedFigure;
  if (lo.value !== null && hi.value !== null) {
    const v = Math.min(lo.value, hi.value);
    dc = { value: v, unit: "unit loads", formula: `min(${lo.value}, ${hi.value}) = ${v}` };
  } else dc = missing("unit loads", "IOL, IIL, IOH and IIH are needed");
  const ac = acFanOutFigure(family.outputOhms, family.maxTransitionNs, family.inputCapPf, family.wiringPf ?? 0);

  let fanOut: DerivedFigure;
  if (family.fanOut !== undefined) {
    fanOut = { value: family.fanOut, unit: "unit loads", formula: `set by the user: ${family.fanOut}` };
  } else if (dc.value !== null && ac.value !== null) {
    const v = Math.min(dc.value, ac.value);
    fanOut = { value: v, unit: "unit loads", formula: `min(DC ${dc.value}, AC ${ac.value}) = ${v}` };
  } else if (dc.value !== null) {
    fanOut = { value: dc.value, unit: "unit loads", formula: `DC fan-out ${dc.value} (AC ${ac.formula})` };
  } else if (ac.value !== null) {
    fanOut = { value: ac.value, unit: "unit loads", formula: `AC fan-out ${ac.value} (DC ${dc.formula})` };
  } else {
    fanOut = { value: DEFAULT_FAN_OUT, unit: "unit loads", formula: `assumed ${DEFAULT_FAN_OUT}: the family gives no fan-out and no currents` };
  }

  const widest = Math.max(
    0,
    ...offeredGates(family)
      .filter((g) => g.type !== "NOT" && g.type !== "BUF")
      .flatMap((g) => g.widths.map((x) => x.width)),
  );
  const fanIn: DerivedFigure = {
    value: widest || null,
    unit: "inputs",
    formula: family.fanIn !== undefined ? `widest gate on offer within the user's fan-in ${family.fanIn}: ${widest}` : `widest gate on offer: ${widest}`,
  };

  const nmh =
    family.vohMin !== undefined && family.vihMin !== undefined
      ? { value: round(family.vohMin - family.vihMin), unit: "V", formula: `NMH = VOH(min) − VIH(min) = ${fmt(family.vohMin)} − ${fmt(family.vihMin)} = ${fmt(round(family.vohMin - family.vihMin))} V` }
      : missing("V", "VOH(min) and VIH(min) are needed");
  const nml =
    family.vilMax !== undefined && family.volMax !== undefined
      ? { value: round(family.vilMax - family.volMax), unit: "V", formula: `NML = VIL(max) − VOL(max) = ${fmt(family.vilMax)} − ${fmt(family.volMax)} = ${fmt(round(family.vilMax - family.volMax))} V` }
      : missing("V", "VIL(max) and VOL(max) are needed");

  return { dcFanOutLow: lo, dcFanOutHigh: hi, dcFanOut: dc, acFanOut: ac, fanOut, fanIn, nmh, nml };
}

function round(x: number): number {
  return Math.round(x * 1e6) / 1e6;
}

/** The fan-out the mapper uses, in unit loads (see deriveFamily). */
export function familyFanOut(family: Family): number {
  return deriveFamily(family).fanOut.value ?? DEFAULT_FAN_OUT;
}

export interface Compatibility {
  /** true / false when the levels are known, null when the figures are missing. */
  compatible: boolean | null;
  highOk: boolean | null;
  lowOk: boolean | null;
  /** Margins at the interface: driver VOH(min) − receiver VIH(min), receiver VIL(max) − driver VOL(max). */
  nmh: DerivedFigure;
  nml: DerivedFigure;
  /** How many receiver inputs one driver output may feed (DC and AC limits), null when not known. */
  receivers: DerivedFigure;
  /** Which output operating point the figures use. */
  point: "light" | "rated" | null;
  messages: string[];
}

/**
 * Whether a driver family's output levels satisfy a receiver family's input
 * thresholds, and how many receiver inputs one driver output may feed. When
 * the driver gives a heavier rated point as well, the check uses the light
 * point if its levels pass and its current feeds at least one receiver, and
 * the rated point otherwise.
 */
export function compatibility(driver: Family, receiver: Family): Compatibility {
  const points: { name: "light" | "rated"; voh?: number; vol?: number; ioh?: number; iol?: number }[] = [
    { name: "light", voh: driver.vohMin, vol: driver.volMax, ioh: driver.iohMa, iol: driver.iolMa },
  ];
  if (driver.ratedDrive) {
    const r = driver.ratedDrive;
    points.push({ name: "rated", voh: r.vohMin, vol: r.volMax, ioh: r.iohMa, iol: r.iolMa });
  }
  const messages: string[] = [];
  let best: Compatibility | null = null;
  let bestPoint = points[0]!;
  for (const p of points) {
    const highOk = p.voh !== undefined && receiver.vihMin !== undefined ? p.voh >= receiver.vihMin - 1e-9 : null;
    const lowOk = p.vol !== undefined && receiver.vilMax !== undefined ? p.vol <= receiver.vilMax + 1e-9 : null;
    const compatible = highOk === null || lowOk === null ? null : highOk && lowOk;
    const nmh: DerivedFigure =
      p.voh !== undefined && receiver.vihMin !== undefined
        ? { value: round(p.voh - receiver.vihMin), unit: "V", formula: `VOH(min) − VIH(min) = ${fmt(p.voh)} − ${fmt(receiver.vihMin)} = ${fmt(round(p.voh - receiver.vihMin))} V` }
        : missing("V", "driver VOH(min) and receiver VIH(min) are needed");
    const nml: DerivedFigure =
      p.vol !== undefined && receiver.vilMax !== undefined
        ? { value: round(receiver.vilMax - p.vol), unit: "V", formula: `VIL(max) − VOL(max) = ${fmt(receiver.vilMax)} − ${fmt(p.vol)} = ${fmt(round(receiver.vilMax - p.vol))} V` }
        : missing("V", "driver VOL(max) and receiver VIL(max) are needed");
    const lo = dcLow(p.iol, receiver.iilMa);
    const hi = dcHigh(p.ioh, receiver.iihMa);
    const ac = acFanOutFigure(driver.outputOhms, receiver.maxTransitionNs, receiver.inputCapPf, receiver.wiringPf ?? driver.wiringPf ?? 0);
    const known = [lo.value, hi.value, ac.value].filter((x): x is number => x !== null);
    const receivers: DerivedFigure =
      compatible === false
        ? { value: 0, unit: "receivers", formula: "levels are not compatible" }
        : known.length === 0
          ? missing("receivers", "driver output currents and receiver input currents are needed")
          : {
              value: Math.min(...known),
              unit: "receivers",
              formula: `min(${[lo, hi, ac].filter((f) => f.value !== null).map((f) => f.formula).join("; ")}) = ${Math.min(...known)}`,
            };
    const c: Compatibility = { compatible, highOk, lowOk, nmh, nml, receivers, point: p.name, messages: [] };
    if (best === null) best = c;
    if (compatible === true && (receivers.value ?? 1) >= 1) {
      best = c;
      bestPoint = p;
      break;
    }
  }
  const c = best!;
  if (c.highOk === false) messages.push(`${driver.name} guarantees a high of only ${bestPoint.voh} V, below the ${receiver.vihMin} V that ${receiver.name} needs to read a high`);
  if (c.lowOk === false) messages.push(`${driver.name} may drive a low of up to ${bestPoint.vol} V, above the ${receiver.vilMax} V that ${receiver.name} reads as low`);
  if (c.compatible === null) messages.push("levels not checked: the driver's output levels or the receiver's input thresholds are missing");
  if (c.receivers.missing) messages.push(`receivers per output not estimated: ${c.receivers.missing}`);
  c.messages = messages;
  return c;
}

export interface CompatibilityCell {
  driver: string;
  receiver: string;
  compatible: boolean | null;
  receivers: number | null;
}

/** Every driver → receiver pair of the given families (row-major: drivers outer). */
export function compatibilityMatrix(families: readonly Family[]): CompatibilityCell[] {
  const out: CompatibilityCell[] = [];
  for (const d of families)
    for (const r of families) {
      const c = compatibility(d, r);
      out.push({ driver: d.id, receiver: r.id, compatible: c.compatible, receivers: c.receivers.value });
    }
  return out;
}
