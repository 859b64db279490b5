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
/** A number as the formulas show it: at most six significant digits. */
export const fmtFigure = (x: number) => (Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6))));

/** 10 %–90 % rise time of a single RC stage: t = R·C·ln 9 ≈ 2.2·R·C. R in Ω, C in pF, result in ns. */
export function riseTimeNs(ohms: number, pf: number): number {
  return (2.2 * ohms * pf) / 1000;
}

/** Default fan-out when a family gives neither a user figure nor enough data (unit loads). */
export const DEFAULT_FAN_OUT = 10;
/** Default widest gate when a family gives neither gates nor a fan-in. */
export const DEFAULT_FAN_IN = 4;

/** A figure that cannot be computed, saying what is missing. */
export function missingFigure(unit: string, what: string): DerivedFigure {
  return { value: null, unit, formula: `not estimated: ${what}`, missing: what };
}

/** Inputs one output may hold low: floor(IOL / |IIL|). */
export function dcFanOutLowFigure(iolMa: number | undefined, iilMa: number | undefined): DerivedFigure {
  if (iolMa === undefined || iilMa === undefined) return missingFigure("unit loads", "IOL and IIL are needed");
  const v = Math.floor(abs(iolMa) / abs(iilMa) + 1e-9);
  return { value: v, unit: "unit loads", formula: `floor(IOL / |IIL|) = floor(${fmtFigure(abs(iolMa))} mA / ${fmtFigure(abs(iilMa))} mA) = ${v}` };
}

/** Inputs one output may hold high: floor(|IOH| / IIH). */
export function dcFanOutHighFigure(iohMa: number | undefined, iihMa: number | undefined): DerivedFigure {
  if (iohMa === undefined || iihMa === undefined) return missingFigure("unit loads", "IOH and IIH are needed");
  const v = Math.floor(abs(iohMa) / abs(iihMa) + 1e-9);
  return { value: v, unit: "unit loads", formula: `floor(|IOH| / IIH) = floor(${fmtFigure(abs(iohMa))} mA / ${fmtFigure(abs(iihMa))} mA) = ${v}` };
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
  if (maxTransitionNs === undefined) return missingFigure("unit loads", "no transition-time limit given");
  if (ohms === undefined) return missingFigure("unit loads", "output resistance is needed");
  if (inputCapPf === undefined) return missingFigure("unit loads", "input capacitance is needed");
  const cMax = (maxTransitionNs * 1000) / (2.2 * ohms);
  const v = Math.max(0, Math.floor((cMax - wiringPf) / inputCapPf + 1e-9));
  return {
    value: v,
    unit: "unit loads",
    formula: `t ≈ 2.2·R·C with C = n·C_in + C_wire: n = floor((${fmtFigure(maxTransitionNs)} ns / (2.2 · ${fmtFigure(ohms)} Ω) − ${fmtFigure(wiringPf)} pF) / ${fmtFigure(inputCapPf)} pF) = ${v}`,
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
  const lo = dcFanOutLowFigure(family.iolMa, family.iilMa);
  const hi = dcFanOutHighFigure(family.iohMa, family.iihMa);
  let dc: DerivedFigure;
  if (lo.value !== null && hi.value !== null) {
    const v = Math.min(lo.value, hi.value);
    dc = { value: v, unit: "unit loads", formula: `min(${lo.value}, ${hi.value}) = ${v}` };
  } else dc = missingFigure("unit loads", "IOL, IIL, IOH and IIH are needed");
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
      ? { value: roundFigure(family.vohMin - family.vihMin), unit: "V", formula: `NMH = VOH(min) − VIH(min) = ${fmtFigure(family.vohMin)} − ${fmtFigure(family.vihMin)} = ${fmtFigure(roundFigure(family.vohMin - family.vihMin))} V` }
      : missingFigure("V", "VOH(min) and VIH(min) are needed");
  const nml =
    family.vilMax !== undefined && family.volMax !== undefined
      ? { value: roundFigure(family.vilMax - family.volMax), unit: "V", formula: `NML = VIL(max) − VOL(max) = ${fmtFigure(family.vilMax)} − ${fmtFigure(family.volMax)} = ${fmtFigure(roundFigure(family.vilMax - family.volMax))} V` }
      : missingFigure("V", "VIL(max) and VOL(max) are needed");

  return { dcFanOutLow: lo, dcFanOutHigh: hi, dcFanOut: dc, acFanOut: ac, fanOut, fanIn, nmh, nml };
}

/** Rounds to 1e-6, so that 2.4 − 2.0 shows as 0.4. */
export function roundFigure(x: number): number {
  return Math.round(x * 1e6) / 1e6;
}

/** The fan-out the mapper uses, in unit loads (see deriveFamily). */
export function familyFanOut(family: Family): number {
  return deriveFamily(family).fanOut.value ?? DEFAULT_FAN_OUT;
}
