/**
 * Maps minimized covers onto a family's gates: fan-in trees of minimum depth,
 * inverting forms kept through the trees, shared inverters and product terms,
 * fan-out buffer trees, then verification against the specification.
 */
import type { Cube, FunctionSpec } from "../logic/index";
import type { Family, GateOffer, GateType } from "../families/types";
import { deriveFamily, offeredGates } from "../families/derive";
import { GATE_TYPES, MAX_GATE_WIDTH } from "../families/types";
import type { Gate, GateRole, Netlist, NetlistOutput } from "./netlist";
import { CONST0, CONST1, topoOrder } from "./netlist";
import { bufferCount, mergeByArrival, planBufferTree, type Group } from "./trees";
import { verdictAssignment, verifyAgainstCovers, verifyNetlist, type VerifyResult } from "./verification";
import type { LogicExpr, LogicNetwork } from "./network";

export type TargetForm = "and-or" | "nand" | "nor" | "or-and" | "mixed";
export const TARGET_FORMS: readonly TargetForm[] = ["and-or", "nand", "nor", "or-and", "mixed"];

/** One output's cover: SOP cubes are products; POS cubes are sum terms ('1' plain literal, '0' complemented). */
export interface CoverOutput {
  name: string;
  form: "sop" | "pos";
  cubes: Cube[];
}

/** Structurally a subset of the minimizer's MinimizeResult. */
export interface CoverSet {
  inputs: string[];
  outputs: CoverOutput[];
}

export interface MapOptions {
  /** Gate set to use; default "and-or". The form does not change the cover: ask the minimizer for POS for "or-and"/"nor". */
  form?: TargetForm;
  /** Widest gate input allowed; caps the family's widths. Default: the family's own. */
  fanIn?: number;
  /** Fan-out in unit loads; default: the family's (user-set, else min(DC, AC)). */
  fanOut?: number;
  /** Complemented inputs are available from outside (no input inverters). Default false. */
  complementedInputs?: boolean;
  /** Load of each output pin in unit loads. Default 1. */
  outputPinLoad?: number;
  /** Specification to verify against; default: the covers themselves. */
  spec?: FunctionSpec;
  /** Verify before returning (default true). */
  verify?: boolean;
  /**
   * What the gate choice and the pricing of realisations minimize first:
   * "gates" (default; then packages, then levels) or "levels" (then gates,
   * then packages).
   */
  aim?: "gates" | "levels";
  /**
   * Put inverters into the spare places of NAND, NOR, XOR or XNOR packages
   * already used (the other inputs tied so the gate inverts) when that saves
   * packages of inverters. Default true.
   */
  spareInverters?: boolean;
}

export interface NetLoad {
  net: string;
  /** Unit loads on the net, output pins included. */
  load: number;
  limit: number;
  /** Gate inputs fed. */
  fanout: number;
  pins: number;
}

export interface MapResult {
  netlist: Netlist;
  verification: VerifyResult | null;
  warnings: string[];
  /** Every realisation priced, in the order tried; `chosen` marks the netlist returned (fewest gates, then packages, then levels). */
  realisations: Realisation[];
  /** The widest gate width used as limit, and the fan-out applied. */
  fanIn: number;
  fanOut: number;
  outputPinLoad: number;
  form: TargetForm;
  family: Family;
}

/** A mapping that cannot be done; the message says what to change. */
export class MapError extends Error {
  override name = "MapError";
}

// ---- internal tree of the logic to build ---------------------------------

type Op = "and" | "or" | "xor";
/**
 * The logic to build. A "flat" node is one operation over all its operands
 * (a product, a sum, an output); each of its shapes is a tree of "op" nodes
 * no wider than one gate width, whose leaves are the flat node's operands.
 */
type MNode =
  | { kind: "const"; value: boolean }
  | { kind: "lit"; input: number; plain: boolean }
  | { kind: "op"; op: Op; kids: MNode[]; arrival: number; id: number }
  /** The complement of a node: built by the node's gate choice in the other polarity. */
  | { kind: "neg"; of: MNode }
  | Flat;

interface Flat {
  kind: "flat";
  id: number;
  op: Op;
  kids: MNode[];
  /** Arrival (levels) of the shape at the widest gate, used to order the merges of enclosing trees. */
  arrival: number;
  /** Tree shapes by gate width (width capped at the operand count). */
  shapes: Map<number, MNode>;
}

interface Choice {
  gates: number;
  depth: number;
  type?: GateType;
  invertOut?: boolean;
  kidPol?: boolean;
  /** For a flat node: the shape chosen, and its gate width. */
  shape?: MNode;
  width?: number;
}

/**
 * One way of pricing the realisations: trees at the widest gate of each
 * operation only, or at every width the form's gates offer; and the charge
 * for a complemented input's inverter, which is built once and shared (so
 * its true cost per use lies between 0 and 1).
 */
interface Policy {
  name: string;
  widths: "widest" | "every";
  inverterCost: number;
}

/** The policies tried, in order; on a tie in gates, packages and depth the earlier one wins. The first is the mapper's original one. */
const POLICIES: Policy[] = [
  { name: "widest gates, shared inverters at 1/4", widths: "widest", inverterCost: 0.25 },
  { name: "every width, shared inverters at 1/4", widths: "every", inverterCost: 0.25 },
  { name: "every width, inverters at full cost", widths: "every", inverterCost: 1 },
  { name: "widest gates, inverters at full cost", widths: "widest", inverterCost: 1 },
];

/** One priced realisation of the covers (see MapResult.realisations). */
export interface Realisation {
  name: string;
  gates: number;
  /** Packages, counting each gate type and width separately; null when the family does not say. */
  packages: number | null;
  depth: number;
  /** True when the figures were priced before the buffers were placed (the fewest each overloaded net needs) and the netlist was not finished. */
  estimated: boolean;
  chosen: boolean;
}

/** For each gate type: the op it computes and the polarities: out = op(in) when out/in both true. */
const IMPL: Record<"and" | "or", { type: GateType; outPlain: boolean; inPlain: boolean }[]> = {
  and: [
    { type: "AND", outPlain: true, inPlain: true },
    { type: "NAND", outPlain: false, inPlain: true },
    { type: "NOR", outPlain: true, inPlain: false },
    { type: "OR", outPlain: false, inPlain: false },
  ],
  or: [
    { type: "OR", outPlain: true, inPlain: true },
    { type: "NOR", outPlain: false, inPlain: true },
    { type: "NAND", outPlain: true, inPlain: false },
    { type: "AND", outPlain: false, inPlain: false },
  ],
};

const FORM_TYPES: Record<TargetForm, GateType[]> = {
  "and-or": ["AND", "OR"],
  "or-and": ["AND", "OR"],
  nand: ["NAND"],
  nor: ["NOR"],
  mixed: ["AND", "OR", "NAND", "NOR"],
};

const FREE: Choice = { gates: 0, depth: 0 };

/** Forms in which XOR and XNOR gates may be used (the NAND–NAND and NOR–NOR forms keep to their one type). */
const XOR_FORMS: readonly TargetForm[] = ["and-or", "or-and", "mixed"];

/** The function of two-level covers as a network: an OR of AND terms (SOP) or an AND of OR terms (POS) per output. */
export function coverNetwork(covers: CoverSet): LogicNetwork {
  const n = covers.inputs.length;
  const lits = (c: Cube): LogicExpr[] => {
    const out: LogicExpr[] = [];
    for (let i = 0; i < n; i++) {
      const bit = 1 << (n - 1 - i);
      if (c.mask & bit) out.push(c.value & bit ? { kind: "input", index: i } : { kind: "not", arg: { kind: "input", index: i } });
    }
    return out;
  };
  return {
    inputs: covers.inputs.slice(),
    outputs: covers.outputs.map((o) => ({
      name: o.name,
      expr: o.form === "sop"
        ? { kind: "or", args: o.cubes.map((c): LogicExpr => ({ kind: "and", args: lits(c) })) }
        : { kind: "and", args: o.cubes.map((c): LogicExpr => ({ kind: "or", args: lits(c) })) },
    })),
  };
}

/**
 * Maps covers onto a family. Throws MapError when the family cannot build the
 * form (a gate type missing, a fan-out below 2) or when verification fails.
 * Without `options.spec` the netlist is proven equal to the covers.
 */
export function mapCovers(covers: CoverSet, family: Family, options: MapOptions = {}): MapResult {
  return mapLogic(coverNetwork(covers), family, options, (netlist) =>
    options.spec ? verifyNetlist(netlist, options.spec) : verifyAgainstCovers(netlist, covers.inputs, covers.outputs),
  );
}

/**
 * Maps a multi-level network (lib/factor builds one) onto a family: shared
 * sub-expressions are built once, nested operations of one kind are merged
 * into one tree, XOR and XNOR gates are used when the family offers them and
 * the form allows them (else an XOR becomes x·y' + x'·y). Verified against
 * `options.spec` when given (and `options.verify` is not false).
 */
export function mapNetwork(network: LogicNetwork, family: Family, options: MapOptions = {}): MapResult {
  return mapLogic(network, family, options, (netlist) => (options.spec ? verifyNetlist(netlist, options.spec) : null));
}

function mapLogic(network: LogicNetwork, family: Family, options: MapOptions, check: (netlist: Netlist) => VerifyResult | null): MapResult {
  const form = options.form ?? "and-or";
  if (options.fanIn !== undefined && (!Number.isInteger(options.fanIn) || options.fanIn < 2 || options.fanIn > MAX_GATE_WIDTH)) {
    throw new MapError(`fan-in ${options.fanIn} cannot be used: give a whole number from 2 to ${MAX_GATE_WIDTH}`);
  }
  if (options.fanIn === undefined && family.fanIn !== undefined && (!Number.isInteger(family.fanIn) || family.fanIn < 2 || family.fanIn > MAX_GATE_WIDTH)) {
    throw new MapError(`${family.name} sets fanIn ${family.fanIn}: change it to a whole number from 2 to ${MAX_GATE_WIDTH}, or give a fan-in setting`);
  }
  // Gate widths size arrays below (tied inputs, NAND-as-inverter), so an unchecked family must not reach them with a huge width.
  for (const g of family.gates ?? []) {
    for (const w of g.widths ?? []) {
      if (!Number.isInteger(w.width) || w.width < 1 || w.width > MAX_GATE_WIDTH) {
        throw new MapError(`${family.name} offers a ${g.type} of width ${w.width}: gate widths must be whole numbers from 1 to ${MAX_GATE_WIDTH}; fix the family's gate list`);
      }
    }
  }
  if (options.fanOut !== undefined && (!Number.isInteger(options.fanOut) || options.fanOut < 2)) {
    throw new MapError(`the fan-out setting ${options.fanOut} is too small: give a whole number of at least 2`);
  }
  const fam: Family = { ...family, ...(options.fanIn !== undefined ? { fanIn: options.fanIn } : {}) };
  const fanOut = options.fanOut ?? fanOutOf(fam);
  const pinLoad = options.outputPinLoad ?? 1;
  const rails = options.complementedInputs ?? false;
  const spare = options.spareInverters ?? true;
  const aim = options.aim ?? "gates";
  const warnings: string[] = [];

  const offers = offeredGates(fam);
  const widths = new Map<GateType, number[]>();
  for (const o of offers) widths.set(o.type, o.widths.map((w) => w.width));
  const allowed = FORM_TYPES[form].filter((t) => (widths.get(t)?.length ?? 0) > 0);
  if (allowed.length === 0) {
    throw new MapError(`${family.name} offers no ${FORM_TYPES[form].join(" or ")} gates for the ${form} form; choose another form or family`);
  }
  const maxWidth = (t: GateType) => Math.max(0, ...(widths.get(t) ?? []));
  const xorTypes = XOR_FORMS.includes(form) ? (["XOR", "XNOR"] as GateType[]).filter((t) => maxWidth(t) >= 2) : [];
  const kOf = (op: Op) =>
    op === "xor" ? Math.max(0, ...xorTypes.map(maxWidth)) : Math.max(...IMPL[op].filter((i) => allowed.includes(i.type)).map((i) => maxWidth(i.type)));
  const fitWidth = (t: GateType, m: number) => (widths.get(t) ?? []).find((w) => w >= m);
  for (const op of ["and", "or"] as const) {
    if (kOf(op) < 2) throw new MapError(`${family.name} offers no gate of 2 or more inputs for the ${form} form; raise the fan-in or choose another family`);
  }
  const notOffered = (widths.get("NOT")?.length ?? 0) > 0;
  const bufOffered = (widths.get("BUF")?.length ?? 0) > 0;

  // ---- names ----
  const n = network.inputs.length;
  const inputSet = new Set(network.inputs);
  for (const o of network.outputs) if (inputSet.has(o.name)) throw new MapError(`output ${o.name} has the name of an input; rename one of them`);
  const usedBase = new Set<string>([...network.inputs, ...network.outputs.map((o) => o.name), CONST0, CONST1]);
  const used = usedBase;
  const complements = rails
    ? network.inputs.map((input) => {
        let net = `${input}_n`;
        while (used.has(net)) net = `${net}_`;
        used.add(net);
        return { input, net };
      })
    : [];

  const railPartner = new Map<string, string>();
  for (const r of complements) {
    railPartner.set(r.input, r.net);
    railPartner.set(r.net, r.input);
  }

  // ---- build the logic: flat operations, each with its tree shapes ----
  const constNode = (v: boolean): MNode => ({ kind: "const", value: v });
  const litArrival = (plain: boolean) => (plain || rails ? 0 : 1);
  const arrivalOf = (x: MNode): number =>
    x.kind === "op" || x.kind === "flat" ? x.arrival : x.kind === "lit" ? litArrival(x.plain) : x.kind === "neg" ? arrivalOf(x.of) : 0;

  const keyOf = new Map<MNode, string>();
  // Op and flat nodes are numbered, so that the choices of a policy live in an array.
  let nodes = 0;
  const litKeys = network.inputs.map((_, i) => [`!x${i}`, `x${i}`]);
  const nodeKey = (x: MNode): string => {
    if (x.kind === "const") return x.value ? "#1" : "#0";
    if (x.kind === "lit") return litKeys[x.input]![x.plain ? 1 : 0]!;
    if (x.kind === "neg") return `~${nodeKey(x.of)}`;
    let k = keyOf.get(x);
    if (k === undefined) {
      k = `${x.op}(${x.kids.map(nodeKey).sort().join(",")})`;
      keyOf.set(x, k);
    }
    return k;
  };
  /** The tree of a flat node at gate width k: the earliest operands merge first (mergeByArrival). */
  const shapeOf = (x: Flat, k: number): MNode => {
    const width = Math.min(k, x.kids.length);
    let t = x.shapes.get(width);
    if (!t) {
      const root = mergeByArrival(x.kids.map((item) => ({ item, arrival: arrivalOf(item) })), width);
      const toNode = (g: Group<MNode>): MNode => ("leaf" in g ? g.leaf : { kind: "op", op: x.op, kids: g.kids.map(toNode), arrival: g.arrival, id: nodes++ });
      t = toNode(root);
      x.shapes.set(width, t);
    }
    return t;
  };
  const makeOp = (op: "and" | "or", kids: MNode[]): MNode => {
    const identity = op === "and";
    const seen = new Set<string>();
    const ks = kids.filter((k) => {
      if (k.kind === "const" && k.value === identity) return false;
      const key = nodeKey(k);
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    });
    if (ks.some((k) => k.kind === "const")) return constNode(!identity);
    if (ks.length === 0) return constNode(identity);
    if (ks.length === 1) return ks[0]!;
    const flat: Flat = { kind: "flat", id: nodes++, op, kids: ks, arrival: 0, shapes: new Map() };
    flat.arrival = arrivalOf(shapeOf(flat, kOf(op)));
    return flat;
  };

  // One node per literal, shared by every term that reads it.
  const litNodes: MNode[][] = network.inputs.map((_, input) => [false, true].map((plain): MNode => ({ kind: "lit", input, plain })));


  // The complement of a node, one object per node.
  const negs = new Map<MNode, MNode>();
  const negate = (m: MNode): MNode => {
    if (m.kind === "const") return constNode(!m.value);
    if (m.kind === "lit") return litNodes[m.input]![m.plain ? 0 : 1]!;
    if (m.kind === "neg") return m.of;
    let x = negs.get(m);
    if (!x) {
      x = { kind: "neg", of: m };
      negs.set(m, x);
    }
    return x;
  };
  /** An XOR over the kids: constants and complements move to the output's polarity, pairs of equal kids cancel. */
  const makeXor = (kids: MNode[]): MNode => {
    let odd = false;
    const kept = new Map<string, MNode>();
    for (let k of kids) {
      if (k.kind === "const") {
        odd = odd !== k.value;
        continue;
      }
      if (k.kind === "neg" || (k.kind === "lit" && !k.plain)) {
        odd = !odd;
        k = negate(k);
      }
      const key = nodeKey(k);
      if (kept.has(key)) kept.delete(key);
      else kept.set(key, k);
    }
    const ks = [...kept.values()];
    let m: MNode;
    if (ks.length === 0) m = constNode(false);
    else if (ks.length === 1) m = ks[0]!;
    else {
      const flat: Flat = { kind: "flat", id: nodes++, op: "xor", kids: ks, arrival: 0, shapes: new Map() };
      flat.arrival = arrivalOf(shapeOf(flat, kOf("xor")));
      m = flat;
    }
    return odd ? negate(m) : m;
  };
  // Parents of each expression (and outputs): a single-use operand of the same kind merges into its parent's tree.
  const uses = new Map<LogicExpr, number>();
  const count = (e: LogicExpr) => {
    const u = (uses.get(e) ?? 0) + 1;
    uses.set(e, u);
    if (u > 1) return;
    if (e.kind === "not") count(e.arg);
    else if (e.kind === "and" || e.kind === "or" || e.kind === "xor") for (const a of e.args) count(a);
  };
  for (const o of network.outputs) count(o.expr);
  const operands = (kind: "and" | "or" | "xor", e: LogicExpr & { args: LogicExpr[] }, out: LogicExpr[]) => {
    for (const a of e.args) {
      if (a.kind === kind && uses.get(a) === 1) operands(kind, a, out);
      else out.push(a);
    }
    return out;
  };
  /** x1 ⊕ … ⊕ xk as ANDs and ORs (x·y' + x'·y), pairwise in a balanced tree, for a form or family without XOR gates. */
  const xorByAndOr = (args: LogicExpr[]): LogicExpr => {
    if (args.length === 1) return args[0]!;
    const half = Math.ceil(args.length / 2);
    const a = xorByAndOr(args.slice(0, half));
    const b = xorByAndOr(args.slice(half));
    return {
      kind: "or",
      args: [
        { kind: "and", args: [a, { kind: "not", arg: b }] },
        { kind: "and", args: [{ kind: "not", arg: a }, b] },
      ],
    };
  };
  const built = new Map<LogicExpr, MNode>();
  const toNode = (e: LogicExpr): MNode => {
    const hit = built.get(e);
    if (hit) return hit;
    let m: MNode;
    switch (e.kind) {
      case "const": m = constNode(e.value); break;
      case "input":
        if (e.index < 0 || e.index >= n) throw new Error(`the network reads input ${e.index} of ${n}`);
        m = litNodes[e.index]![1]!;
        break;
      case "not": m = negate(toNode(e.arg)); break;
      case "xor": {
        const args = operands("xor", e, []);
        m = xorTypes.length ? makeXor(args.map(toNode)) : toNode(xorByAndOr(args));
        break;
      }
      default: m = makeOp(e.kind, operands(e.kind, e, []).map(toNode));
    }
    built.set(e, m);
    return m;
  };
  const roots = network.outputs.map((o) => toNode(o.expr));

  /** Gate widths a flat operation's trees are tried at: the widest first, then every other width of the form's gates for it. */
  const everyWidth = (op: Op): number[] => {
    const ks = [kOf(op)];
    const types = op === "xor" ? xorTypes : IMPL[op].filter((i) => allowed.includes(i.type)).map((i) => i.type);
    for (const t of types) for (const w of widths.get(t) ?? []) if (w >= 2 && !ks.includes(w)) ks.push(w);
    return ks;
  };
  const implsOf: Record<"and" | "or", (typeof IMPL)["and"]> = {
    and: IMPL.and.filter((i) => allowed.includes(i.type)),
    or: IMPL.or.filter((i) => allowed.includes(i.type)),
  };
  const widthsFor: Record<Policy["widths"], Record<Op, number[]>> = {
    widest: { and: [kOf("and")], or: [kOf("or")], xor: [kOf("xor")] },
    every: { and: everyWidth("and"), or: everyWidth("or"), xor: everyWidth("xor") },
  };
  const perPackage = new Map<string, number>();
  for (const o of offers) for (const w of o.widths) perPackage.set(`${o.type}/${w.width}`, w.perPackage);
  const knownPackages = (family.gates?.length ?? 0) > 0;
  const railNets = complements.map((c) => c.net);

  /** Chooses, under one policy, each flat node's shape and each tree node's gate type and polarities (fewest gates, then least depth). */
  const choose = (policy: Policy) => {
    const inverterChoice: Choice = { gates: policy.inverterCost, depth: 1 };
    // memo[2·id + polarity]
    const memo: Choice[] = [];
    const better =
      aim === "levels"
        ? (a: Choice, b: Choice) => a.depth < b.depth || (a.depth === b.depth && a.gates < b.gates - 1e-9)
        : (a: Choice, b: Choice) => a.gates < b.gates - 1e-9 || (Math.abs(a.gates - b.gates) < 1e-9 && a.depth < b.depth);
    const ks = widthsFor[policy.widths];
    const cost = (x: MNode, pol: boolean): Choice => {
      if (x.kind === "const") return FREE;
      if (x.kind === "lit") return x.plain === pol || rails ? FREE : inverterChoice;
      if (x.kind === "neg") return cost(x.of, !pol);
      const hit = memo[2 * x.id + (pol ? 1 : 0)];
      if (hit) return hit;
      {
        const best: [Choice | null, Choice | null] = [null, null];
        if (x.kind === "flat") {
          for (const k of ks[x.op]) {
            const shape = shapeOf(x, k);
            for (const want of [false, true]) {
              const c = cost(shape, want);
              const idx = want ? 1 : 0;
              if (best[idx] === null || better(c, best[idx]!)) best[idx] = { gates: c.gates, depth: c.depth, shape, width: Math.min(k, x.kids.length) };
            }
          }
        } else if (x.op === "xor") {
          for (const type of xorTypes) {
            if (fitWidth(type, x.kids.length) === undefined) continue;
            for (const kidPol of [true, false]) {
              let gates = 1;
              let depth = 0;
              for (const kid of x.kids) {
                const c = cost(kid, kidPol);
                gates += c.gates;
                if (c.depth > depth) depth = c.depth;
              }
              depth += 1;
              // XOR of complemented operands flips the output once per operand
              const outPlain = ((type === "XNOR" ? 1 : 0) ^ (kidPol ? 0 : x.kids.length & 1)) === 0;
              for (const want of [false, true]) {
                const inv = outPlain !== want;
                const c: Choice = { gates: gates + (inv ? 1 : 0), depth: depth + (inv ? 1 : 0), type, invertOut: inv, kidPol };
                const idx = want ? 1 : 0;
                if (best[idx] === null || better(c, best[idx]!)) best[idx] = c;
              }
            }
          }
        } else {
          for (const impl of implsOf[x.op]) {
            if (fitWidth(impl.type, x.kids.length) === undefined) continue;
            let gates = 1;
            let depth = 0;
            for (const kid of x.kids) {
              const c = cost(kid, impl.inPlain);
              gates += c.gates;
              if (c.depth > depth) depth = c.depth;
            }
            depth += 1;
            for (const want of [false, true]) {
              const inv = impl.outPlain !== want;
              const c: Choice = { gates: gates + (inv ? 1 : 0), depth: depth + (inv ? 1 : 0), type: impl.type, invertOut: inv, kidPol: impl.inPlain };
              const idx = want ? 1 : 0;
              if (best[idx] === null || better(c, best[idx]!)) best[idx] = c;
            }
          }
        }
        if (!best[0] || !best[1]) throw new MapError(`no gate of the ${form} form is ${x.kids.length} inputs wide`);
        memo[2 * x.id] = best[0];
        memo[2 * x.id + 1] = best[1];
      }
      return memo[2 * x.id + (pol ? 1 : 0)]!;
    };
    return cost;
  };
  type CostFn = ReturnType<typeof choose>;

  /** The choices met on the way the netlist is emitted, as numbers: equal lists give equal netlists. */
  const choicesMet = (cost: CostFn): number[] => {
    const out: number[] = [];
    // a node met again (a shared sub-expression) has the same choices: walked once
    const met: boolean[] = [];
    const walk = (x: MNode, pol: boolean) => {
      if (x.kind === "const" || x.kind === "lit") return;
      if (x.kind === "neg") return walk(x.of, !pol);
      const slot = 2 * x.id + (pol ? 1 : 0);
      if (met[slot]) return;
      met[slot] = true;
      const c = cost(x, pol);
      if (x.kind === "flat") {
        out.push(c.width!);
        walk(c.shape!, pol);
        return;
      }
      out.push(GATE_TYPES.indexOf(c.type!) * 4 + (c.invertOut ? 2 : 0) + (c.kidPol ? 1 : 0));
      for (const k of x.kids) walk(k, c.kidPol!);
    };
    for (const r of roots) walk(r, true);
    return out;
  };

  /** Emits the gates of one set of choices, names the output nets and drops gates that feed nothing. */
  const emitLogic = (cost: CostFn) => {
    const used = new Set(usedBase);
    let counter = 0;
    const fresh = (prefix: string) => {
      let name: string;
      do name = `${prefix}${++counter}`;
      while (used.has(name));
      used.add(name);
      return name;
    };

    // ---- emit gates ----
    const gates: Gate[] = [];
    const byKey = new Map<string, string>();
    const driverOf = new Map<string, Gate>();
    const inverted = new Map<string, string>();
    const addGate = (type: GateType, inputs: string[], role: GateRole, key?: string): string => {
      if (key !== undefined) {
        const hit = byKey.get(key);
        if (hit) return hit;
      }
      const output = fresh("n");
      const g: Gate = { id: `g${gates.length + 1}`, type, inputs, output, role };
      gates.push(g);
      driverOf.set(output, g);
      if (key !== undefined) byKey.set(key, output);
      return output;
    };
    const invert = (net: string): string => {
      if (net === CONST0) return CONST1;
      if (net === CONST1) return CONST0;
      const d = driverOf.get(net);
      if (d && d.type === "NOT") return d.inputs[0]!;
      const rail = railPartner.get(net);
      if (rail !== undefined) return rail;
      const hit = inverted.get(net);
      if (hit) return hit;
      let out: string;
      if (notOffered) out = addGate("NOT", [net], "inverter");
      else {
        const t = allowed.find((x) => x === "NAND" || x === "NOR") ?? (["NAND", "NOR"] as GateType[]).find((x) => (widths.get(x)?.length ?? 0) > 0);
        if (!t) throw new MapError(`${family.name} offers no inverter (NOT, or a NAND/NOR to tie as one)`);
        const w = widths.get(t)![0]!;
        out = addGate(t, new Array(w).fill(net), "inverter");
      }
      inverted.set(net, out);
      inverted.set(out, net);
      return out;
    };
    // the net of each node and polarity emitted, so a shared sub-expression is walked once
    const emitted: string[] = [];
    const emit = (x: MNode, pol: boolean): string => {
      if (x.kind === "const") return x.value === pol ? CONST1 : CONST0;
      if (x.kind === "lit") {
        const name = network.inputs[x.input]!;
        return x.plain === pol ? name : invert(name);
      }
      if (x.kind === "neg") return emit(x.of, !pol);
      const slot = 2 * x.id + (pol ? 1 : 0);
      const done = emitted[slot];
      if (done !== undefined) return done;
      const net = emitNode(x, pol);
      emitted[slot] = net;
      return net;
    };
    const emitNode = (x: Extract<MNode, { id: number }>, pol: boolean): string => {
      const c = cost(x, pol);
      if (x.kind === "flat") return emit(c.shape!, pol);
      const type = c.type!;
      const kidNets = x.kids.map((k) => emit(k, c.kidPol!));
      const w = fitWidth(type, kidNets.length)!;
      const tie = type === "AND" || type === "NAND" ? CONST1 : CONST0;
      const inputs = [...kidNets, ...new Array<string>(w - kidNets.length).fill(tie)];
      const key = `${type}(${[...kidNets].sort().join(",")}|${w})`;
      const out = addGate(type, inputs, "logic", key);
      return c.invertOut ? invert(out) : out;
    };

    const outNets = roots.map((r) => emit(r, true));

    // ---- name output nets after their outputs ----
    const rename = new Map<string, string>();
    const outputs: NetlistOutput[] = network.outputs.map((o, i) => {
      const net = outNets[i]!;
      if (driverOf.has(net) && !rename.has(net)) rename.set(net, o.name);
      return { name: o.name, net: rename.get(net) ?? net };
    });
    const rn = (x: string) => rename.get(x) ?? x;
    for (const g of gates) {
      g.output = rn(g.output);
      g.inputs = g.inputs.map(rn);
    }
    for (const o of outputs) o.net = rn(o.net);

    // ---- remove gates that feed nothing (inverters made for a polarity later undone) ----
    const live = pruneDead(gates, outputs);

    return { live, outputs, fresh };
  };
  type Emitted = ReturnType<typeof emitLogic>;

  /**
   * Figures of an emitted netlist before its buffers are placed: the buffers
   * each overloaded net will need (the fewest a buffer tree can have), the
   * packages once inverters take spare places, the levels without buffers.
   */
  const estimate = (e: Emitted) => {
    const load = new Map<string, number>();
    const pinned = new Map<string, number>();
    for (const g of e.live) for (const i of g.inputs) if (i !== CONST0 && i !== CONST1) load.set(i, (load.get(i) ?? 0) + 1);
    for (const o of e.outputs) {
      if (o.net === CONST0 || o.net === CONST1) continue;
      load.set(o.net, (load.get(o.net) ?? 0) + pinLoad);
      if (o.name === o.net) pinned.set(o.net, (pinned.get(o.net) ?? 0) + pinLoad);
    }
    let buffers = 0;
    for (const [net, l] of load) if (l > fanOut + 1e-9 && (pinned.get(net) ?? 0) <= fanOut - 1) buffers += bufferCount(Math.ceil(l - 1e-9), fanOut);
    const count = typeWidthCounts(e.live);
    if (buffers) count.set("BUF/1", (count.get("BUF/1") ?? 0) + buffers);
    if (spare) for (const m of spareMoves(count, offers)) {
      count.set("NOT/1", count.get("NOT/1")! - 1);
      count.set(`${m.type}/${m.width}`, count.get(`${m.type}/${m.width}`)! + 1);
    }
    let packages = 0;
    for (const [k, c] of count) packages += Math.ceil(c / (perPackage.get(k) ?? 1));
    return { gates: e.live.length + buffers, packages: knownPackages ? packages : null, depth: gateLevels({ inputs: [], outputs: e.outputs, gates: e.live, complements: [] }) };
  };

  /** The netlist from an emitted one: fan-out buffer trees, inverters in spare places, topological order and gate ids. */
  const finishNetlist = (e: Emitted) => {
    const warnings: string[] = [];
    // ---- fan-out: buffer trees where a load exceeds the fan-out ----
    const buffered = insertBuffers(e.live, e.outputs, fanOut, pinLoad, network.inputs, railNets, e.fresh, bufOffered, warnings);
    let live = buffered.gates;
    if (!bufOffered && live.some((g) => g.role === "buffer")) warnings.push(`${family.name} lists no buffer; BUF gates were used for the fan-out trees`);

    // ---- inverters into the spare places of packages already on the board ----
    if (spare) live = fillSparePlaces(live, offers);

    const netlist: Netlist = { inputs: network.inputs.slice(), outputs: buffered.outputs, gates: live, complements };
    netlist.gates = topoOrder(netlist).map((g, i) => ({ ...g, id: `g${i + 1}` }));
    return { netlist, warnings, gates: netlist.gates.length, packages: knownPackages ? packageCount(netlist.gates, perPackage) : null, depth: gateLevels(netlist) };
  };

  // ---- price the realisations; keep the fewest gates, then packages, then levels ----
  // A policy whose choices equal an earlier one's gives the same netlist: it is emitted once. Each netlist is
  // priced with its buffers counted (not yet placed); the cheapest is finished, and so is the first policy's
  // when it is another, and the two compare on their finished figures, so the result is never worse than the
  // first policy's (the mapper's original one).
  type Figures = { gates: number; packages: number | null; depth: number };
  const ahead = (a: Figures, b: Figures) => {
    const x = aim === "levels" ? [a.depth, a.gates, a.packages ?? 0] : [a.gates, a.packages ?? 0, a.depth];
    const y = aim === "levels" ? [b.depth, b.gates, b.packages ?? 0] : [b.gates, b.packages ?? 0, b.depth];
    const k = x.findIndex((v, j) => v !== y[j]);
    return k >= 0 && x[k]! < y[k]!;
  };
  const same = (a: number[], b: number[]) => a.length === b.length && a.every((x, i) => x === b[i]);
  const unique: { met: number[]; emitted: Emitted; est: Figures; done?: ReturnType<typeof finishNetlist> }[] = [];
  const slotOf = POLICIES.map((policy) => {
    const cost = choose(policy);
    const met = choicesMet(cost);
    let k = unique.findIndex((x) => same(x.met, met));
    if (k < 0) {
      const emitted = emitLogic(cost);
      unique.push({ met, emitted, est: estimate(emitted) });
      k = unique.length - 1;
    }
    return k;
  });
  let best = 0;
  for (let k = 1; k < unique.length; k++) if (ahead(unique[k]!.est, unique[best]!.est)) best = k;
  const finished = (k: number) => (unique[k]!.done ??= finishNetlist(unique[k]!.emitted));
  let pick = best;
  if (best !== 0 && ahead(finished(0), finished(best))) pick = 0;
  else finished(best);
  const { netlist } = finished(pick);
  warnings.push(...finished(pick).warnings);
  const realisations: Realisation[] = POLICIES.map((policy, i) => {
    const u = unique[slotOf[i]!]!;
    const f = u.done ?? u.est;
    return { name: policy.name, gates: f.gates, packages: f.packages, depth: f.depth, estimated: !u.done, chosen: slotOf[i] === pick && slotOf.indexOf(pick) === i };
  });

  let verification: VerifyResult | null = null;
  if (options.verify !== false) {
    // lib/verify: exhaustive on truth tables up to 20 inputs, SAT above
    verification = check(netlist);
    if (verification && !verification.ok) {
      const v = verification;
      const expected = v.kind === "missing" ? 1 : 0;
      const at = verdictAssignment(v, (options.spec ?? network).inputs.length);
      throw new MapError(`internal check failed: output ${v.output} gives ${1 - expected} at inputs ${at} where ${expected} is specified; please report this design`);
    }
  }
  return { netlist, verification, warnings, realisations, fanIn: Math.max(kOf("and"), kOf("or")), fanOut, outputPinLoad: pinLoad, form, family: fam };
}

/**
 * The family's fan-out, refused with a message naming where it came from when
 * it is below 2: a family's own figure, or one derived from its currents or
 * edge-rate figures (which validateFamily reports, but a family may reach the
 * mapper unchecked).
 */
function fanOutOf(family: Family): number {
  const d = deriveFamily(family);
  const v = d.fanOut.value ?? 0;
  if (Number.isInteger(v) && v >= 2) return v;
  if (family.fanOut !== undefined) {
    throw new MapError(`${family.name} sets fanOut ${family.fanOut}: change it to a whole number of at least 2, or give a fan-out setting`);
  }
  const why: string[] = [];
  if (d.dcFanOut.value !== null && d.dcFanOut.value < 2) why.push(`DC fan-out ${d.dcFanOut.value} from ${d.dcFanOutLow.formula} and ${d.dcFanOutHigh.formula}`);
  if (d.acFanOut.value !== null && d.acFanOut.value < 2) why.push(`AC fan-out ${d.acFanOut.value} from ${d.acFanOut.formula}`);
  throw new MapError(
    `${family.name}'s figures give a derived fan-out of ${v} unit loads (${d.fanOut.formula}; ${why.join("; ")}), and mapping needs at least 2: ` +
      "give a fan-out setting, set fanOut in the family, or fix IOL/IIL/IOH/IIH in the family" +
      (d.acFanOut.value !== null && d.acFanOut.value < 2 ? " (and its output resistance, transition limit or input capacitance)" : ""),
  );
}

/** Packages of a gate list: each type and width fills its own packages of `perPackage` gates (1 when unknown). */
function packageCount(gates: Gate[], perPackage: Map<string, number>): number {
  const count = new Map<string, number>();
  for (const g of gates) {
    const k = `${g.type}/${g.inputs.length}`;
    count.set(k, (count.get(k) ?? 0) + 1);
  }
  let total = 0;
  for (const [k, c] of count) total += Math.ceil(c / (perPackage.get(k) ?? 1));
  return total;
}

/** Gate levels on the longest path from an input to an output of a netlist whose gates are in topological order. */
function gateLevels(n: Netlist): number {
  const level = new Map<string, number>();
  for (const g of n.gates) {
    let lv = 0;
    for (const i of g.inputs) lv = Math.max(lv, level.get(i) ?? 0);
    level.set(g.output, lv + 1);
  }
  return n.outputs.reduce((m, o) => Math.max(m, level.get(o.net) ?? 0), 0);
}

/** How a gate of each inverting type is tied to act as an inverter of its first input. */
const INVERTING_TIES: Partial<Record<GateType, (width: number) => string[]>> = {
  NAND: (w) => new Array<string>(w - 1).fill(CONST1),
  NOR: (w) => new Array<string>(w - 1).fill(CONST0),
  // x ⊕ 1 ⊕ 0 ⊕ … = x'
  XOR: (w) => [CONST1, ...new Array<string>(w - 2).fill(CONST0)],
  // ¬(x ⊕ 0 ⊕ …) = x'
  XNOR: (w) => new Array<string>(w - 1).fill(CONST0),
};

/**
 * Moves NOT gates into the unused places of NAND, NOR, XOR and XNOR packages
 * already in the netlist, with the other inputs tied (NAND to 1, NOR to 0,
 * XOR to 1 then 0, XNOR to 0) so that each inverts, when that leaves fewer
 * packages of NOT gates: as few as give the fewest inverter packages. Gate
 * count, loads (a tied input loads no net) and levels stay as they are.
 */
export function fillSparePlaces(gates: Gate[], offers: GateOffer[]): Gate[] {
  const moves = spareMoves(typeWidthCounts(gates), offers);
  if (moves.length === 0) return gates;
  const moved = new Map<Gate, Gate>();
  let k = 0;
  for (const g of gates) {
    if (k === moves.length) break;
    if (g.type !== "NOT") continue;
    const p = moves[k++]!;
    moved.set(g, { ...g, type: p.type, inputs: [g.inputs[0]!, ...INVERTING_TIES[p.type]!(p.width)] });
  }
  return gates.map((g) => moved.get(g) ?? g);
}

/** Gates per "TYPE/width". */
function typeWidthCounts(gates: Gate[]): Map<string, number> {
  const count = new Map<string, number>();
  for (const g of gates) {
    const k = `${g.type}/${g.inputs.length}`;
    count.set(k, (count.get(k) ?? 0) + 1);
  }
  return count;
}

/**
 * The places NOT gates move to (one per NOT moved, first NOTs first): free
 * places of inverting types in packages already used, in the family's order
 * of types and widths; as few as give the fewest packages of NOT gates, none
 * when no package is saved.
 */
function spareMoves(count: Map<string, number>, offers: GateOffer[]): { type: GateType; width: number }[] {
  const nots = count.get("NOT/1") ?? 0;
  const notPer = offers.find((o) => o.type === "NOT")?.widths.find((w) => w.width === 1)?.perPackage;
  if (nots === 0 || notPer === undefined) return [];
  const places: { type: GateType; width: number }[] = [];
  for (const o of offers) {
    if (!INVERTING_TIES[o.type]) continue;
    for (const w of o.widths) {
      const c = count.get(`${o.type}/${w.width}`) ?? 0;
      if (c === 0 || w.width < 2) continue;
      const free = Math.ceil(c / w.perPackage) * w.perPackage - c;
      for (let k = 0; k < free && places.length < nots; k++) places.push({ type: o.type, width: w.width });
    }
  }
  const fewest = Math.ceil((nots - places.length) / notPer);
  if (fewest === Math.ceil(nots / notPer)) return [];
  return places.slice(0, nots - fewest * notPer);
}

function pruneDead(gates: Gate[], outputs: NetlistOutput[]): Gate[] {
  const need = new Set(outputs.map((o) => o.net));
  const driver = new Map(gates.map((g) => [g.output, g]));
  const stack = [...need];
  while (stack.length) {
    const net = stack.pop()!;
    const g = driver.get(net);
    if (!g) continue;
    for (const i of g.inputs) if (!need.has(i)) {
      need.add(i);
      stack.push(i);
    }
  }
  return gates.filter((g) => need.has(g.output));
}

/**
 * Longest path, in gates, from each net to any output (0 at an output pin and
 * at a net nothing reads): one pass over the gates in reverse topological
 * order, where every reader of a gate's output has been seen before the gate.
 */
function tails(gates: Gate[], outputs: NetlistOutput[]): Map<string, number> {
  const order = topoOrder({ inputs: [], outputs, gates, complements: [] });
  const tail = new Map<string, number>();
  for (const o of outputs) tail.set(o.net, 0);
  for (let k = order.length - 1; k >= 0; k--) {
    const g = order[k]!;
    const t = 1 + (tail.get(g.output) ?? 0);
    for (const i of g.inputs) {
      const was = tail.get(i);
      if (was === undefined || t > was) tail.set(i, t);
    }
  }
  return tail;
}

function insertBuffers(
  gates: Gate[],
  outputs: NetlistOutput[],
  fanOut: number,
  pinLoad: number,
  inputs: string[],
  rails: string[],
  fresh: (p: string) => string,
  _bufOffered: boolean,
  warnings: string[],
): { gates: Gate[]; outputs: NetlistOutput[] } {
  const tail = tails(gates, outputs);
  // Each load names its reader by index in `out` (a gate) or in `outs` (an output pin, gate −1); a reader is
  // copied once, on its first rewired input. Only the output the net is named after must stay on it; other
  // outputs sharing the net are read first from the driver and may move behind a buffer like any input.
  type Load = { gate: number; pin: number; weight: number; criticality: number; pinned: boolean };
  const loadsOf = new Map<string, Load[]>();
  const push = (net: string, x: Load) => {
    const ls = loadsOf.get(net);
    if (ls) ls.push(x);
    else loadsOf.set(net, [x]);
  };
  gates.forEach((g, gi) => {
    const crit = 1 + (tail.get(g.output) ?? 0);
    g.inputs.forEach((i, pin) => {
      if (i !== CONST0 && i !== CONST1) push(i, { gate: gi, pin, weight: 1, criticality: crit, pinned: false });
    });
  });
  outputs.forEach((o, k) => {
    if (o.net !== CONST0 && o.net !== CONST1) push(o.net, { gate: -1, pin: k, weight: pinLoad, criticality: Infinity, pinned: o.name === o.net });
  });
  const out = gates.slice();
  const outs = outputs.slice();
  const copied = new Uint8Array(gates.length);
  const drivers = new Set([...inputs, ...rails, ...gates.map((g) => g.output)]);
  for (const [net, loads] of loadsOf) {
    if (!drivers.has(net)) continue;
    let total = 0;
    for (const l of loads) total += l.weight;
    if (total <= fanOut + 1e-9) continue;
    let pinned = 0;
    for (const l of loads) if (l.pinned) pinned += l.weight;
    if (pinned > fanOut - 1) {
      warnings.push(`net ${net}: output pin load ${pinned} leaves no room under fan-out ${fanOut}; the pin stays on its driver over the limit`);
      continue;
    }
    const plan = planBufferTree(loads, fanOut);
    const bufNets = plan.buffers.map(() => fresh("b"));
    plan.buffers.forEach((b, i) => {
      const src = b.parent < 0 ? net : bufNets[b.parent]!;
      out.push({ id: `buf_${bufNets[i]}`, type: "BUF", inputs: [src], output: bufNets[i]!, role: "buffer" });
    });
    loads.forEach((l, i) => {
      const a = plan.assignment[i]!;
      if (a >= 0 && l.gate < 0) outs[l.pin] = { ...outs[l.pin]!, net: bufNets[a]! };
      else if (a >= 0) {
        if (!copied[l.gate]) {
          out[l.gate] = { ...out[l.gate]!, inputs: out[l.gate]!.inputs.slice() };
          copied[l.gate] = 1;
        }
        out[l.gate]!.inputs[l.pin] = bufNets[a]!;
      }
    });
  }
  return { gates: out, outputs: outs };
}
