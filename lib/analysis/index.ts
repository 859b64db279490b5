/**
 * Figures a designer signs off: gate and package counts, transistors, depth,
 * critical path delay, static and dynamic power, each net's load against its
 * limit. Delay, power and loading are estimates from the family's typical
 * figures and each carries CAUTION.
 */
import type { Family, GateType } from "../families/types";
import { familyFanOut, offeredGates } from "../families/derive";
import { compatibility, VERDICT_WORDS, type Verdict } from "../families/compat";
import type { Netlist } from "../map/netlist";
import { CONST0, CONST1, topoOrder } from "../map/netlist";

export const CAUTION =
  "Estimate from the family's typical figures — check the data sheets of the parts you use and your own design rules.";

export interface AnalysisOptions {
  /** Fan-out limit per net in unit loads; default: the family's. */
  fanOut?: number;
  /** Load of each output pin in unit loads; default 1. */
  outputPinLoad?: number;
  /** Clock frequency for dynamic power, MHz; default 10. */
  clockMHz?: number;
  /**
   * Activity factor: the share of clock cycles in which a net makes a 0→1
   * transition; default 0.25 (a random signal with equal chances of 0 and 1).
   */
  activity?: number;
  /**
   * For a family with a TTL-high input current (Family.ttlHighInputMa): the
   * share of gate inputs fed from the design's inputs that sit at a TTL high
   * level; default 0.5 (half high on average). Use 0 when the design's inputs
   * are driven rail to rail.
   */
  ttlHighShare?: number;
  /**
   * The families at the design's edges: the one whose outputs drive the
   * design's inputs, and the one whose inputs its outputs drive. Each given
   * boundary is checked for levels (noise margins) and loads; default none.
   */
  boundary?: { inputsDrivenBy?: Family; outputsDrive?: Family };
}

/** Where the design meets another family: levels and loads at its inputs or its outputs. */
export interface BoundaryCheck {
  side: "inputs" | "outputs";
  driver: { id: string; name: string };
  receiver: { id: string; name: string };
  verdict: Verdict;
  /** Noise margins at the boundary, V. */
  nmhV: number | null;
  nmlV: number | null;
  /** Receiver inputs one driver output may feed in the high and low state (DC), and the least of all limits. */
  fanOutHigh: number | null;
  fanOutLow: number | null;
  perOutput: number | null;
  /** The heaviest load at the boundary: gate inputs fed by one design input, or receiver inputs on one design output. */
  load: number;
  /** Where the heaviest load is: the input net, or "each output". */
  at: string;
  formulas: string[];
  messages: string[];
  caution: string;
}

export interface TypeWidthRow {
  type: GateType;
  width: number;
  count: number;
  /** Gates of this type and width per package, null when the family does not say. */
  perPackage: number | null;
  packages: number | null;
}

export interface NetLoadRow {
  net: string;
  /** Unit loads: gate inputs fed plus output pin load. */
  load: number;
  limit: number;
  status: "ok" | "at-limit" | "over";
  driver: string;
}

export interface Estimate {
  value: number | null;
  unit: string;
  formula: string;
  caution: string;
  note?: string;
}

export interface Analysis {
  gates: number;
  byType: Partial<Record<GateType, number>>;
  byTypeWidth: TypeWidthRow[];
  packages: number | null;
  packagesNote?: string;
  transistors: number | null;
  transistorsNote?: string;
  /** Gate levels on the longest path from an input to an output. */
  depth: number;
  criticalPath: { nets: string[]; gates: string[]; levels: number; delay: Estimate };
  staticPower: Estimate;
  dynamicPower: Estimate;
  loads: NetLoadRow[];
  maxLoad: number;
  /** Checks where the design meets the families named in AnalysisOptions.boundary (empty when none is named). */
  boundaries: BoundaryCheck[];
  warnings: string[];
  caution: string;
}

const r3 = (x: number) => Math.round(x * 1000) / 1000;

/** Analyses a mapped netlist against its family. */
export function analyse(netlist: Netlist, family: Family, options: AnalysisOptions = {}): Analysis {
  const fanOut = options.fanOut ?? familyFanOut(family);
  const pinLoad = options.outputPinLoad ?? 1;
  const clockMHz = options.clockMHz ?? 10;
  const activity = options.activity ?? 0.25;
  const warnings: string[] = [];
  const gates = topoOrder(netlist);

  // ---- counts ----
  const byType: Partial<Record<GateType, number>> = {};
  const tw = new Map<string, TypeWidthRow>();
  const offers = offeredGates(family);
  for (const g of gates) {
    byType[g.type] = (byType[g.type] ?? 0) + 1;
    const key = `${g.type}/${g.inputs.length}`;
    let row = tw.get(key);
    if (!row) {
      const per = offers.find((o) => o.type === g.type)?.widths.find((w) => w.width === g.inputs.length)?.perPackage ?? null;
      row = { type: g.type, width: g.inputs.length, count: 0, perPackage: family.gates ? per : null, packages: null };
      tw.set(key, row);
    }
    row.count++;
  }
  const byTypeWidth = [...tw.values()].sort((a, b) => a.type.localeCompare(b.type) || a.width - b.width);
  for (const row of byTypeWidth) row.packages = row.perPackage ? Math.ceil(row.count / row.perPackage) : null;
  let packages: number | null = byTypeWidth.reduce((s, r) => s + (r.packages ?? 0), 0);
  let packagesNote: string | undefined;
  const unknownPk = byTypeWidth.filter((r) => r.packages === null);
  if (unknownPk.length) {
    packagesNote = `not counted: the family does not say how many ${unknownPk.map((r) => `${r.width}-input ${r.type}`).join(", ")} gates fit one package`;
    if (unknownPk.length === byTypeWidth.length) packages = null;
  }

  let transistors: number | null = null;
  let transistorsNote: string | undefined;
  if (family.transistors) {
    let t = 0;
    const missing = new Set<string>();
    for (const g of gates) {
      const m = family.transistors[g.type];
      if (m) t += m.base + m.perInput * g.inputs.length;
      else missing.add(g.type);
    }
    transistors = t;
    if (missing.size) transistorsNote = `${[...missing].join(", ")} gates not counted: the family gives no transistor count for them`;
  } else transistorsNote = "not counted: the family gives no transistor counts";

  // ---- loads ----
  // Nets are numbered once (inputs, complemented inputs, then gate outputs in order) and every per-net
  // figure below lives in a typed array indexed by that number: one map lookup per gate pin in all.
  const netId = new Map<string, number>();
  const netName: string[] = [];
  const driverName: string[] = [];
  const driverGate: number[] = [];
  const idOf = (net: string): number => {
    let id = netId.get(net);
    if (id === undefined) {
      id = netName.length;
      netId.set(net, id);
      netName.push(net);
      driverName.push("?");
      driverGate.push(-1);
    }
    return id;
  };
  for (const i of netlist.inputs) driverName[idOf(i)] = "input";
  for (const r of netlist.complements) driverName[idOf(r.net)] = "input";
  gates.forEach((g, gi) => {
    const id = idOf(g.output);
    driverName[id] = g.id;
    driverGate[id] = gi;
  });
  // Gate pins as one flat array: the pins of gate gi are pin[pinAt[gi]] up to pin[pinAt[gi + 1]].
  const pinAt = new Int32Array(gates.length + 1);
  gates.forEach((g, gi) => (pinAt[gi + 1] = pinAt[gi]! + g.inputs.length));
  const pin = new Int32Array(pinAt[gates.length]!);
  gates.forEach((g, gi) => g.inputs.forEach((net, k) => (pin[pinAt[gi]! + k] = idOf(net))));
  const outIds = netlist.outputs.map((o) => idOf(o.net));
  const constId = (net: string) => net === CONST0 || net === CONST1;
  const isConst = new Uint8Array(netName.length);
  netName.forEach((nm, id) => (isConst[id] = constId(nm) ? 1 : 0));
  const load = new Float64Array(netName.length);
  // Rows come in the order nets are first loaded (gate pins in gate order, then output pins).
  const seen = new Uint8Array(netName.length);
  const rowOrder: number[] = [];
  const add = (id: number, w: number) => {
    if (isConst[id]) return;
    if (!seen[id]) {
      seen[id] = 1;
      rowOrder.push(id);
    }
    load[id] = load[id]! + w;
  };
  for (let k = 0; k < pin.length; k++) add(pin[k]!, 1);
  for (const id of outIds) add(id, pinLoad);
  const loads: NetLoadRow[] = rowOrder.map((id) => {
    const l = load[id]!;
    return {
      net: netName[id]!,
      load: r3(l),
      limit: fanOut,
      status: l > fanOut + 1e-9 ? "over" : Math.abs(l - fanOut) < 1e-9 ? "at-limit" : "ok",
      driver: driverName[id]!,
    };
  });
  // A loop, not a spread: a netlist may hold more nets than a call may take arguments.
  const maxLoad = loads.reduce((m, l) => (l.load > m ? l.load : m), 0);
  for (const l of loads) if (l.status === "over") warnings.push(`net ${l.net} carries ${l.load} unit loads, over the fan-out of ${fanOut}`);

  // ---- depth and critical path ----
  const hasDelay = family.intrinsicNs !== undefined;
  const gateDelay = (gi: number) => (family.intrinsicNs ?? 0) + (family.perLoadNs ?? 0) * load[netId.get(gates[gi]!.output)!]!;
  const level = new Float64Array(netName.length);
  const arrival = new Float64Array(netName.length);
  gates.forEach((g, gi) => {
    let lv = 0;
    let at = 0;
    let first = true;
    for (let k = pinAt[gi]!; k < pinAt[gi + 1]!; k++) {
      const id = pin[k]!;
      if (level[id]! > lv) lv = level[id]!;
      const a = hasDelay ? arrival[id]! : level[id]!;
      if (first || a > at) {
        at = a;
        first = false;
      }
    }
    const me = netId.get(g.output)!;
    level[me] = lv + 1;
    arrival[me] = at + (hasDelay ? gateDelay(gi) : 1);
  });
  const depth = outIds.reduce((m, id) => Math.max(m, level[id]!), 0);
  let end = -1;
  for (const id of outIds) if (end < 0 || arrival[id]! > arrival[end]!) end = id;
  const pathGates: string[] = [];
  const pathNets: string[] = [];
  for (let id = end; id >= 0; ) {
    pathNets.push(netName[id]!);
    const gi = driverGate[id]!;
    if (gi < 0) break;
    pathGates.push(gates[gi]!.id);
    let best = -1;
    for (let k = pinAt[gi]!; k < pinAt[gi + 1]!; k++) if (best < 0 || arrival[pin[k]!]! > arrival[best]!) best = pin[k]!;
    id = best;
  }
  pathNets.reverse();
  pathGates.reverse();
  const endNet = end >= 0 ? netName[end] : undefined;
  const delayNs = endNet !== undefined && hasDelay ? r3(arrival[end]!) : hasDelay ? 0 : null;
  const delay: Estimate = {
    value: delayNs,
    unit: "ns",
    formula: hasDelay
      ? `Σ over the path of (t_intrinsic ${family.intrinsicNs} ns + ${family.perLoadNs ?? 0} ns × unit loads driven)`
      : "not estimated: the family gives no delay model",
    caution: CAUTION,
    ...(hasDelay ? {} : { note: "the family gives no intrinsic delay" }),
  };

  // ---- power ----
  const v = family.supplyV;
  let staticPower: Estimate =
    family.staticMaPerGate !== undefined && v !== undefined
      ? {
          value: r3(family.staticMaPerGate * v * gates.length),
          unit: "mW",
          formula: `I_static ${family.staticMaPerGate} mA × ${v} V × ${gates.length} gates`,
          caution: CAUTION,
        }
      : { value: null, unit: "mW", formula: "not estimated: the family gives no supply current or supply voltage", caution: CAUTION };
  if (staticPower.value !== null && v !== undefined && family.ttlHighInputMa !== undefined && family.ttlHighInputMa > 0) {
    // Only pins fed from outside can sit at a TTL high: inner nets are driven by the family's own rail-to-rail outputs.
    const outside = new Set([...netlist.inputs, ...netlist.complements.map((c) => c.net)]);
    const pins = gates.reduce((s, g) => s + g.inputs.filter((i) => outside.has(i)).length, 0);
    const share = options.ttlHighShare ?? 0.5;
    const base = family.staticMaPerGate! * v * gates.length;
    const extra = family.ttlHighInputMa * v * pins * share;
    staticPower = {
      value: r3(base + extra),
      unit: "mW",
      formula: `${staticPower.formula} + ΔI ${family.ttlHighInputMa} mA × ${v} V × ${pins} input pins fed from outside × ${share} at a TTL high`,
      caution: CAUTION,
      note:
        `assumes the design's inputs are driven at TTL levels and ${share * 100} % of the ${pins} gate inputs they feed are high on average; ` +
        "inner nets swing rail to rail and draw no extra current",
    };
  }
  let dynamicPower: Estimate;
  if (family.inputCapPf !== undefined && v !== undefined) {
    let cTotal = 0;
    for (const g of gates) cTotal += load[netId.get(g.output)!]! * family.inputCapPf + (family.wiringPf ?? 0) + (family.powerCapPf ?? 0);
    // pF · V² · MHz = µW
    const mW = (cTotal * v * v * clockMHz * activity) / 1000;
    dynamicPower = {
      value: r3(mW),
      unit: "mW",
      formula: `C · V² · f · activity = ${r3(cTotal)} pF × (${v} V)² × ${clockMHz} MHz × ${activity}` +
        ` (C = Σ per gate of unit loads × ${family.inputCapPf} pF + wiring ${family.wiringPf ?? 0} pF + internal ${family.powerCapPf ?? 0} pF)`,
      caution: CAUTION,
    };
  } else {
    dynamicPower = { value: null, unit: "mW", formula: "not estimated: the family gives no input capacitance or supply voltage", caution: CAUTION };
  }
  // ---- boundaries with other families ----
  const boundaries: BoundaryCheck[] = [];
  const b = options.boundary ?? {};
  if (b.inputsDrivenBy) {
    let at = "";
    let heaviest = 0;
    for (const net of [...netlist.inputs, ...netlist.complements.map((c) => c.net)]) {
      const id = netId.get(net);
      const l = id === undefined ? 0 : load[id]!;
      if (l > heaviest) [heaviest, at] = [l, net];
    }
    boundaries.push(boundaryCheck("inputs", b.inputsDrivenBy, family, r3(heaviest), at ? `input ${at}` : "no input"));
  }
  if (b.outputsDrive) boundaries.push(boundaryCheck("outputs", family, b.outputsDrive, Math.ceil(pinLoad - 1e-9), "each output"));
  for (const c of boundaries) warnings.push(...boundaryWarnings(c));

  if (delay.value === null) warnings.push("critical-path delay not estimated: the family gives no delay model");
  if (staticPower.value === null) warnings.push("static power not estimated: the family gives no supply current or voltage");
  if (dynamicPower.value === null) warnings.push("dynamic power not estimated: the family gives no input capacitance or voltage");

  return {
    gates: gates.length,
    byType,
    byTypeWidth,
    packages,
    ...(packagesNote ? { packagesNote } : {}),
    transistors,
    ...(transistorsNote ? { transistorsNote } : {}),
    depth,
    criticalPath: { nets: pathNets, gates: pathGates, levels: pathGates.length, delay },
    staticPower,
    dynamicPower,
    loads,
    maxLoad,
    boundaries,
    warnings,
    caution: CAUTION,
  };
}

function boundaryCheck(side: "inputs" | "outputs", driver: Family, receiver: Family, load: number, at: string): BoundaryCheck {
  const c = compatibility(driver, receiver);
  return {
    side,
    driver: { id: driver.id, name: driver.name },
    receiver: { id: receiver.id, name: receiver.name },
    verdict: c.verdict,
    nmhV: c.nmh.value,
    nmlV: c.nml.value,
    fanOutHigh: c.fanOutHigh.value,
    fanOutLow: c.fanOutLow.value,
    perOutput: c.receivers.value,
    load,
    at,
    formulas: [c.nmh.formula, c.nml.formula, c.fanOutHigh.formula, c.fanOutLow.formula, ...(c.fanOutAc.value !== null ? [c.fanOutAc.formula] : [])],
    messages: c.messages,
    caution: CAUTION,
  };
}

/** The sentences a boundary adds to the design's warnings. */
function boundaryWarnings(c: BoundaryCheck): string[] {
  const where = c.side === "inputs" ? `inputs driven by ${c.driver.name}` : `outputs driving ${c.receiver.name}`;
  const out: string[] = [];
  if (c.verdict !== "compatible") out.push(`${where}: ${VERDICT_WORDS[c.verdict]}${c.messages.length ? ` — ${c.messages.join("; ")}` : ""}`);
  if (c.verdict !== "not-compatible" && c.perOutput !== null && c.load > c.perOutput) {
    out.push(
      c.side === "inputs"
        ? `${where}: ${c.at} feeds ${c.load} gate inputs, but one ${c.driver.name} output may feed only ${c.perOutput} ${c.receiver.name} inputs; buffer it, or split its loads`
        : `${where}: each output drives ${c.load} ${c.receiver.name} inputs (the pin load), but may feed only ${c.perOutput}; add an output buffer`,
    );
  }
  return out;
}
