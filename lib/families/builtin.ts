/**
 * Built-in families. Names are generic and our own; figures come from the
 * usual handbook tables of each technology and from JEDEC JESD8-C for the
 * 3.3 V levels. Each figure names its source in `sources`; "from memory"
 * marks figures recalled rather than read from a table at hand, so a user
 * should check them against the data sheets of the parts actually used.
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
const TTL_TABLE = "handbook table, standard bipolar TTL (recommended operating conditions / electrical characteristics)";
const LS_TABLE = "handbook table, low-power Schottky TTL (electrical characteristics)";
const HC_TABLE = "handbook table, high-speed CMOS at VCC = 5 V (VIH = 0.7·VCC, VIL = 0.3·VCC; VOH = VCC − 0.1 V and VOL = 0.1 V at |IO| = 20 µA)";
const HCT_TABLE = "handbook table, high-speed CMOS with TTL-level inputs (VIH 2.0 V, VIL 0.8 V; outputs as high-speed CMOS)";
const JESD8 = "JEDEC JESD8-C, 3.3 V LVTTL/LVCMOS levels (from memory of the standard's table)";

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
    description: "Silicon-gate CMOS with CMOS input thresholds; draws almost nothing while holding a level.",
    supplyV: 5,
    vohMin: 4.9,
    volMax: 0.1,
    vihMin: 3.5,
    vilMax: 1.5,
    iohMa: -0.02,
    iolMa: 0.02,
    iihMa: 0.001,
    iilMa: -0.001,
    inputCapPf: 10,
    outputOhms: 65,
    maxTransitionNs: 500,
    wiringPf: 5,
    intrinsicNs: 9,
    perLoadNs: 0.05,
    staticMaPerGate: 0.0005,
    powerCapPf: 20,
    gates: HC_GATES,
    transistors: CMOS_TRANSISTORS,
    ratedDrive: { iohMa: 4, iolMa: 4, vohMin: 3.98, volMax: 0.26, source: `${MEM} (rated 4 mA point, VCC = 4.5 V column, conservative at 5 V)` },
    sources: {
      supplyV: HC_TABLE, vohMin: HC_TABLE, volMax: HC_TABLE, vihMin: HC_TABLE, vilMax: HC_TABLE,
      iohMa: HC_TABLE, iolMa: HC_TABLE, iihMa: `${MEM} (input leakage, ±1 µA maximum)`, iilMa: `${MEM} (input leakage, ±1 µA maximum)`,
      inputCapPf: `${MEM} (maximum input capacitance)`, outputOhms: `${MEM} (about 0.26 V at 4 mA)`,
      maxTransitionNs: `${MEM} (input rise/fall time limit at VCC = 4.5 V)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical propagation delay at 15 pF)`, perLoadNs: MEM,
      staticMaPerGate: `${MEM} (quiescent supply current 2 µA per package at 25 °C, four gates)`,
      powerCapPf: `${MEM} (typical power-dissipation capacitance per gate)`,
      gates: MEM, transistors: `${MEM} (static CMOS: NAND/NOR of n inputs 2n; AND/OR 2n + 2)`,
    },
  },
  {
    id: "cmos-hct-5v",
    name: "High-speed CMOS with TTL-level inputs, 5 V",
    technology: "cmos",
    builtIn: true,
    description: "High-speed CMOS whose inputs read TTL levels; each input held at a TTL high level draws extra supply current.",
    supplyV: 5,
    vohMin: 4.9,
    volMax: 0.1,
    vihMin: 2.0,
    vilMax: 0.8,
    iohMa: -0.02,
    iolMa: 0.02,
    iihMa: 0.001,
    iilMa: -0.001,
    inputCapPf: 10,
    outputOhms: 65,
    maxTransitionNs: 500,
    wiringPf: 5,
    intrinsicNs: 11,
    perLoadNs: 0.05,
    staticMaPerGate: 0.0005,
    powerCapPf: 24,
    ttlHighInputMa: 0.36,
    gates: HC_GATES,
    transistors: CMOS_TRANSISTORS,
    ratedDrive: { iohMa: 4, iolMa: 4, vohMin: 3.98, volMax: 0.26, source: `${MEM} (rated 4 mA point, VCC = 4.5 V column, conservative at 5 V)` },
    sources: {
      supplyV: HCT_TABLE, vohMin: HCT_TABLE, volMax: HCT_TABLE, vihMin: HCT_TABLE, vilMax: HCT_TABLE,
      iohMa: HCT_TABLE, iolMa: HCT_TABLE, iihMa: `${MEM} (input leakage, ±1 µA maximum)`, iilMa: `${MEM} (input leakage, ±1 µA maximum)`,
      inputCapPf: `${MEM} (maximum input capacitance)`, outputOhms: `${MEM} (about 0.26 V at 4 mA)`,
      maxTransitionNs: `${MEM} (input rise/fall time limit at VCC = 4.5 V)`, wiringPf: `${MEM} (short board trace)`,
      intrinsicNs: `${MEM} (typical propagation delay at 15 pF)`, perLoadNs: MEM,
      staticMaPerGate: `${MEM} (quiescent 2 µA per package with CMOS-level inputs)`,
      ttlHighInputMa: `${MEM} (additional quiescent supply current, about 0.36 mA per input held at 2.4 V, other inputs at the rails)`,
      powerCapPf: `${MEM} (typical power-dissipation capacitance per gate)`,
      gates: MEM, transistors: `${MEM} (static CMOS core; the TTL-level input stage is not counted)`,
    },
  },
  {
    id: "lvcmos-3v3",
    name: "Low-voltage CMOS, 3.3 V",
    technology: "cmos",
    builtIn: true,
    description: "3.3 V CMOS with LVTTL/LVCMOS levels per JEDEC JESD8-C.",
    supplyV: 3.3,
    vohMin: 2.8,
    volMax: 0.2,
    vihMin: 2.0,
    vilMax: 0.8,
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
