/**
 * Built-in families. Names are generic and our own; figures come from the
 * standard tables of each technology: the standard and low-power Schottky TTL
 * figures that digital-design textbooks and handbooks tabulate, JEDEC JESD7A
 * for high-speed CMOS (54/74HC- and HCT-type logic) and JEDEC JESD8-C for the
 * 3.3 V levels. Each figure names its source in `sources`; "from memory"
 * marks figures recalled rather than read from a table at hand, so a user
 * should check them against the data sheets of the parts actually used.
 *
 * Each family's levels and currents come from one column of its table: TTL's
 * guaranteed limits hold over its whole supply range (4.75 to 5.25 V); the
 * high-speed CMOS standard tabulates each supply point apart, and both CMOS
 * families here use its VCC = 4.5 V column throughout — the low end of a
 * 5 V ± 10 % supply, where its output levels are at their worst — over
 * −40 to 85 °C.
 */
import type { Family, GateOffer, TransistorModel, GateType } from "./types";

const w = (width: number, perPackage: number) => ({ width, perPackage });

const TTL_GATES: GateOffer[] = [
  { type: "NAND", widths: [w(2, 4), w(3, 3), w(4, 2), w(8, 1), w(13, 1)] },
  { type: "AND", widths: [w(2, 4), w(3, 3), w(4, 2)] },
  { type: "NOR", widths: [w(2, 4), w(3, 3)] },
  { type: "OR", widths: [w(2, 4)] },
  { type: "XOR", widths: [w(2, 4)] },
  { type: "NOT", widths: [w(1, 6)] },
  { type: "BUF", widths: [w(1, 6)] },
];

const HC_GATES: GateOffer[] = [
  { type: "NAND", widths: [w(2, 4), w(3, 3), w(4, 2), w(8, 1)] },
  { type: "AND", widths: [w(2, 4), w(3, 3), w(4, 2)] },
  { type: "NOR", widths: [w(2, 4), w(3, 3), w(4, 2)] },
  { type: "OR", widths: [w(2, 4), w(3, 3)] },
  { type: "XOR", widths: [w(2, 4)] },
  { type: "XNOR", widths: [w(2, 4)] },
  { type: "NOT", widths: [w(1, 6)] },
  { type: "BUF", widths: [w(1, 6)] },
];

// Low-voltage lines are thinner: no 8-input NAND, no 4-input AND/NOR.
const LV_GATES: GateOffer[] = [
  { type: "NAND", widths: [w(2, 4), w(3, 3), w(4, 2)] },
  { type: "AND", widths: [w(2, 4), w(3, 3)] },
  { type: "NOR", widths: [w(2, 4), w(3, 3)] },
  { type: "OR", widths: [w(2, 4)] },
  { type: "XOR", widths: [w(2, 4)] },
  { type: "NOT", widths: [w(1, 6)] },
  { type: "BUF", widths: [w(1, 6)] },
];

/** Static CMOS: n-input NAND/NOR = 2n; AND/OR add an output inverter (2n + 2). */
const CMOS_TRANSISTORS: Partial<Record<GateType, TransistorModel>> = {
  NAND: { base: 0, perInput: 2 },
  NOR: { base: 0, perInput: 2 },
  AND: { base: 2, perInput: 2 },
  OR: { base: 2, perInput: 2 },
  NOT: { base: 2, perInput: 0 },
  BUF: { base: 4, perInput: 0 },
  XOR: { base: 12, perInput: 0 },
  XNOR: { base: 12, perInput: 0 },
};

const MEM = "from memory";
const TTL_TABLE = "standard TTL figures as textbooks and handbooks tabulate them (guaranteed limits at VCC 4.75–5.25 V, 0–70 °C)";
const LS_TABLE = "low-power Schottky TTL figures as textbooks and handbooks tabulate them (guaranteed limits at VCC 4.75–5.25 V, 0–70 °C)";
const JESD7 = "JEDEC JESD7A, high-speed CMOS, VCC = 4.5 V column, −40 to 85 °C";
const HC_LEVELS = `${JESD7} (VIH 3.15 V and VIL 1.35 V, that is 0.7 and 0.3 of VCC; VOH 4.4 V and VOL 0.1 V at |IO| = 20 µA)`;
const HCT_LEVELS = `${JESD7} (TTL-level inputs: VIH 2.0 V, VIL 0.8 V; outputs as high-speed CMOS: VOH 4.4 V and VOL 0.1 V at |IO| = 20 µA)`;
const JESD8 = "JEDEC JESD8-C, 3.3 V LVTTL/LVCMOS levels (from memory of the standard's table)";
/** Output resistance from the 4 mA point of the same column; the weaker (high) side sets the slower edge. */
const HC_OHMS = `${JESD7}: (VCC − VOH)/|IOH| = (4.5 − 3.84) V / 4 mA = 165 Ω on the high side (the low side, 0.33 V / 4 mA, is 82.5 Ω); the weaker side is taken`;

export const BUILT_IN_FAMILIES: readonly Family[] = [
  {
    id: "ttl-std-5v",
    name: "Bipolar TTL, standard, 5 V",
    technology: "bipolar",
    builtIn: true,
    description: "Totem-pole bipolar logic. Draws supply current while holding either level.",
    supplyV: 5,
    vohMin: 2.4,
    volMax: 0.4,
    vihMin: 2.0,
    vilMax: 0.8,
    iohMa: -0.4,
    iolMa: 16,
    iihMa: 0.04,
    iilMa: -1.6,
    inputCapPf: 3,
    outputOhms: 130,
    wiringPf: 5,
    intrinsicNs: 10,
    perLoadNs: 0.1,
    staticMaPerGate: 2,
    gates: TTL_GATES,
    sources: {
      supplyV: TTL_TABLE, vohMin: TTL_TABLE, volMax: TTL_TABLE, vihMin: TTL_TABLE, vilMax: TTL_TABLE,
      iohMa: TTL_TABLE, iolMa: TTL_TABLE, iihMa: TTL_TABLE, iilMa: TTL_TABLE,
      inputCapPf: MEM, outputOhms: `${MEM} (high-side pull-up of the totem pole)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical propagation delay at 15 pF)`, perLoadNs: MEM,
      staticMaPerGate: `${MEM} (typical supply current of a quad 2-input NAND, high and low states averaged, per gate)`,
      gates: MEM,
    },
  },
  {
    id: "ttl-ls-5v",
    name: "Low-power Schottky TTL, 5 V",
    technology: "bipolar",
    builtIn: true,
    description: "Schottky-clamped bipolar logic at a fifth of the standard line's input current.",
    supplyV: 5,
    vohMin: 2.7,
    volMax: 0.5,
    vihMin: 2.0,
    vilMax: 0.8,
    iohMa: -0.4,
    iolMa: 8,
    iihMa: 0.02,
    iilMa: -0.4,
    inputCapPf: 3,
    outputOhms: 120,
    wiringPf: 5,
    intrinsicNs: 9.5,
    perLoadNs: 0.1,
    staticMaPerGate: 0.4,
    gates: TTL_GATES,
    sources: {
      supplyV: LS_TABLE, vohMin: LS_TABLE, volMax: `${LS_TABLE} (at IOL = 8 mA)`, vihMin: LS_TABLE, vilMax: LS_TABLE,
      iohMa: LS_TABLE, iolMa: LS_TABLE, iihMa: LS_TABLE, iilMa: LS_TABLE,
      inputCapPf: MEM, outputOhms: MEM, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical propagation delay at 15 pF)`, perLoadNs: MEM,
      staticMaPerGate: `${MEM} (typical supply current of a quad 2-input NAND, averaged, per gate)`,
      gates: MEM,
    },
  },
  {
    id: "cmos-hc-5v",
    name: "High-speed CMOS, 5 V",
    technology: "cmos",
    builtIn: true,
    description:
      "Silicon-gate CMOS with CMOS input thresholds; draws almost nothing while holding a level. " +
      "Figures at VCC = 4.5 V, the low end of a 5 V ± 10 % supply, over −40 to 85 °C.",
    supplyV: 4.5,
    vohMin: 4.4,
    volMax: 0.1,
    vihMin: 3.15,
    vilMax: 1.35,
    iohMa: -0.02,
    iolMa: 0.02,
    iihMa: 0.001,
    iilMa: -0.001,
    inputCapPf: 10,
    outputOhms: 165,
    maxTransitionNs: 500,
    wiringPf: 5,
    intrinsicNs: 9,
    perLoadNs: 0.05,
    staticMaPerGate: 0.005,
    powerCapPf: 20,
    gates: HC_GATES,
    transistors: CMOS_TRANSISTORS,
    ratedDrive: { iohMa: 4, iolMa: 4, vohMin: 3.84, volMax: 0.33, source: `${JESD7} (VOH 3.84 V at IOH = −4 mA, VOL 0.33 V at IOL = 4 mA)` },
    sources: {
      supplyV: `${JESD7} (the supply point of every figure of this family)`,
      vohMin: HC_LEVELS, volMax: HC_LEVELS, vihMin: HC_LEVELS, vilMax: HC_LEVELS,
      iohMa: `${JESD7} (the light CMOS load at which VOH(min) 4.4 V holds)`, iolMa: `${JESD7} (the light CMOS load at which VOL(max) 0.1 V holds)`,
      iihMa: `${JESD7} (input leakage ±1 µA over temperature, stated at VCC = 6 V, its worst case)`,
      iilMa: `${JESD7} (input leakage ±1 µA over temperature, stated at VCC = 6 V, its worst case)`,
      inputCapPf: `${JESD7} (maximum input capacitance 10 pF)`, outputOhms: HC_OHMS,
      maxTransitionNs: `${JESD7} (input rise and fall time limit 500 ns at VCC = 4.5 V)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical delay of a 2-input gate at VCC = 4.5 V into 50 pF, about 9 ns; taken as the intrinsic delay, conservative at lighter loads)`,
      perLoadNs: MEM,
      staticMaPerGate: `${JESD7} (quiescent supply current of a small-scale package, 20 µA over temperature, stated at VCC = 6 V, its worst case; four gates)`,
      powerCapPf: `${MEM} (typical power-dissipation capacitance per gate)`,
      gates: MEM, transistors: `${MEM} (static CMOS: NAND/NOR of n inputs 2n; AND/OR 2n + 2)`,
    },
  },
  {
    id: "cmos-hct-5v",
    name: "High-speed CMOS with TTL-level inputs, 5 V",
    technology: "cmos",
    builtIn: true,
    description:
      "High-speed CMOS whose inputs read TTL levels; each input held at a TTL high level draws extra supply current. " +
      "Figures at VCC = 4.5 V, the low end of a 5 V ± 10 % supply, over −40 to 85 °C.",
    supplyV: 4.5,
    vohMin: 4.4,
    volMax: 0.1,
    vihMin: 2.0,
    vilMax: 0.8,
    iohMa: -0.02,
    iolMa: 0.02,
    iihMa: 0.001,
    iilMa: -0.001,
    inputCapPf: 10,
    outputOhms: 165,
    maxTransitionNs: 500,
    wiringPf: 5,
    intrinsicNs: 11,
    perLoadNs: 0.05,
    staticMaPerGate: 0.005,
    powerCapPf: 24,
    ttlHighInputMa: 0.45,
    gates: HC_GATES,
    transistors: CMOS_TRANSISTORS,
    ratedDrive: { iohMa: 4, iolMa: 4, vohMin: 3.84, volMax: 0.33, source: `${JESD7} (VOH 3.84 V at IOH = −4 mA, VOL 0.33 V at IOL = 4 mA)` },
    sources: {
      supplyV: `${JESD7} (the supply point of every figure of this family)`,
      vohMin: HCT_LEVELS, volMax: HCT_LEVELS, vihMin: HCT_LEVELS, vilMax: HCT_LEVELS,
      iohMa: `${JESD7} (the light CMOS load at which VOH(min) 4.4 V holds)`, iolMa: `${JESD7} (the light CMOS load at which VOL(max) 0.1 V holds)`,
      iihMa: `${JESD7} (input leakage ±1 µA over temperature)`, iilMa: `${JESD7} (input leakage ±1 µA over temperature)`,
      inputCapPf: `${JESD7} (maximum input capacitance 10 pF)`, outputOhms: HC_OHMS,
      maxTransitionNs: `${JESD7} (input rise and fall time limit 500 ns at VCC = 4.5 V)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical delay of a 2-input gate at VCC = 4.5 V into 50 pF, about 11 ns; taken as the intrinsic delay)`,
      perLoadNs: MEM,
      staticMaPerGate: `${JESD7} (quiescent supply current 20 µA per small-scale package over temperature with CMOS-level inputs; four gates)`,
      ttlHighInputMa: `${JESD7} (additional quiescent supply current per input held at VCC − 2.1 V, 0.45 mA over −40 to 85 °C; other inputs at the rails)`,
      powerCapPf: `${MEM} (typical power-dissipation capacitance per gate)`,
      gates: MEM, transistors: `${MEM} (static CMOS core; the TTL-level input stage is not counted)`,
    },
  },
  {
    id: "lvcmos-3v3",
    name: "Low-voltage CMOS, 3.3 V",
    technology: "cmos",
    builtIn: true,
    description: "3.3 V CMOS with LVTTL/LVCMOS levels per JEDEC JESD8-C; its inputs are not 5 V tolerant.",
    supplyV: 3.3,
    vohMin: 2.8,
    volMax: 0.2,
    vihMin: 2.0,
    vilMax: 0.8,
    inputMaxV: 3.8,
    iohMa: -0.1,
    iolMa: 0.1,
    iihMa: 0.005,
    iilMa: -0.005,
    inputCapPf: 5,
    outputOhms: 25,
    maxTransitionNs: 33,
    wiringPf: 5,
    intrinsicNs: 3.5,
    perLoadNs: 0.05,
    staticMaPerGate: 0.0025,
    powerCapPf: 10,
    gates: LV_GATES,
    transistors: CMOS_TRANSISTORS,
    ratedDrive: { iohMa: 2, iolMa: 2, vohMin: 2.4, volMax: 0.4, source: `${JESD8} — LVTTL output levels at |IO| = 2 mA` },
    sources: {
      supplyV: JESD8, vihMin: JESD8, vilMax: JESD8,
      inputMaxV: `${MEM} (absolute maximum input VDD + 0.5 V at the nominal 3.3 V, usual for 3.3 V CMOS inputs without 5 V tolerance)`,
      vohMin: `${JESD8} — LVCMOS: VDD − 0.2 V at −100 µA, taken at VDD(min) = 3.0 V`,
      volMax: `${JESD8} — LVCMOS: 0.2 V at 100 µA`,
      iohMa: JESD8, iolMa: JESD8,
      iihMa: `${MEM} (input leakage ±5 µA)`, iilMa: `${MEM} (input leakage ±5 µA)`,
      inputCapPf: `${MEM} (typical input capacitance)`, outputOhms: `${MEM} (strong 3.3 V outputs, about 0.55 V at 24 mA)`,
      maxTransitionNs: `${MEM} (input transition rate limit 10 ns/V over a 3.3 V swing)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical propagation delay at 50 pF)`, perLoadNs: MEM,
      staticMaPerGate: `${MEM} (quiescent 10 µA per package, four gates)`,
      powerCapPf: `${MEM} (typical power-dissipation capacitance per gate)`,
      gates: MEM, transistors: `${MEM} (static CMOS: NAND/NOR of n inputs 2n; AND/OR 2n + 2)`,
    },
  },
];

/** The built-in family with this id, or undefined. */
export function builtInFamily(id: string): Family | undefined {
  return BUILT_IN_FAMILIES.find((f) => f.id === id);
}
