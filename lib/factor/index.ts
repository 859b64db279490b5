/**
 * The multi-level stage: from minimized two-level covers to a factored logic
 * network, mapped onto the family's gates and proven equal to the
 * specification. See README.md for the methods and their sources.
 *
 * Three structures are built and priced by the mapper, and the designer's
 * aim decides: "gates" keeps the fewest gates (then packages, then levels),
 * "levels" the fewest levels (then gates, then packages); a tie keeps the
 * two-level structure.
 * - two-level: the covers as they are;
 * - decomposed: functional decomposition on truth tables (./decompose) up to
 *   TRUTH_TABLE_MAX_INPUTS inputs, its leaves factored algebraically;
 * - algebraic: every output's cover factored algebraically (./algebra),
 *   with kernels and cubes extracted across outputs (up to
 *   ALGEBRAIC_MAX_CUBES cubes in all).
 * The two-level structure is always among them, so the result is never
 * worse than the two-level mapping by the chosen aim.
 */
import type { Cube, FunctionSpec } from "../logic/index";
import { TRUTH_TABLE_MAX_INPUTS, minterm } from "../logic/index";
import { minimize } from "../minimize/index";
import { coverNetwork, mapNetwork, type CoverSet, type LogicExpr, type LogicNetwork, type MapOptions, type MapResult } from "../map/index";
import { FALSE, TRUE, negate } from "../map/network";
import { extract, factor, type FExpr, type Sop } from "./algebra";
import { Decomposer, type DExpr } from "./decompose";
import { TableSpace } from "./truth";

export type Aim = "gates" | "levels";
export type Structure = "decomposed" | "algebraic" | "two-level";

export interface FactorOptions {
  /** What the designer wants fewest of: "gates" (default; then packages, then levels) or "levels" (then gates, then packages). */
  aim?: Aim;
  /** The two-level mapping already made of the same covers, family and settings (the pipeline's): priced as it is, not mapped again. */
  twoLevel?: MapResult;
}

/** Above this many cubes in all, the algebraic structure is not built (it would be the two-level one, at length). */
export const ALGEBRAIC_MAX_CUBES = 5000;

export interface StructureFigures {
  structure: Structure;
  gates: number;
  packages: number | null;
  levels: number;
  chosen: boolean;
}

export interface FactorResult {
  /** The mapping kept (verified against the specification). */
  mapped: MapResult;
  structure: Structure;
  /** Every structure priced, in the order built. */
  structures: StructureFigures[];
  aim: Aim;
}

/** Literal cubes (2·v + complemented) of a cover's cubes over n inputs; POS sum terms are read as the OFF-set's products. */
function literalCubes(cubes: readonly Cube[], n: number, pos: boolean): Sop {
  return cubes.map((c) => {
    const out: number[] = [];
    for (let i = 0; i < n; i++) {
      const bit = 1 << (n - 1 - i);
      if (c.mask & bit) {
        const plain = (c.value & bit) !== 0;
        // a sum term's literal x is the OFF product's x'
        out.push(2 * i + (plain !== pos ? 0 : 1));
      }
    }
    return out;
  });
}

/** Builds expressions from algebraic nodes, each node once. */
class NodeExprs {
  private built = new Map<number, LogicExpr>();
  constructor(
    private readonly n: number,
    private readonly nodes: Sop[],
  ) {}
  node(k: number): LogicExpr {
    let e = this.built.get(k);
    if (!e) {
      e = this.expr(factor(this.nodes[k]!));
      this.built.set(k, e);
    }
    return e;
  }
  private literal(l: number): LogicExpr {
    const v = l >>> 1;
    const e: LogicExpr = v < this.n ? { kind: "input", index: v } : this.node(v - this.n);
    return l & 1 ? negate(e) : e;
  }
  expr(f: FExpr): LogicExpr {
    switch (f.kind) {
      case "const": return f.value ? TRUE : FALSE;
      case "lit": return this.literal(f.lit);
      case "not": return negate(this.expr(f.arg));
      default: return { kind: f.kind, args: f.args.map((a) => this.expr(a)) };
    }
  }
}

/** The algebraic structure: every output's cover factored, kernels and cubes extracted across outputs. */
export function algebraicNetwork(covers: CoverSet): LogicNetwork {
  const n = covers.inputs.length;
  const sops = covers.outputs.map((o) => literalCubes(o.cubes, n, o.form === "pos"));
  const nodes = extract(n, sops);
  const ex = new NodeExprs(n, nodes);
  return {
    inputs: covers.inputs.slice(),
    outputs: covers.outputs.map((o, k) => ({ name: o.name, expr: o.form === "pos" ? negate(ex.node(k)) : ex.node(k) })),
  };
}

/**
 * The decomposed structure (inputs ≤ TRUTH_TABLE_MAX_INPUTS): each output's
 * function (the cover's, so don't-cares stay as the minimizer chose them) is
 * decomposed on its truth table; the leaves are minimized over their own
 * inputs and factored algebraically together. Null above the table limit.
 */
export function decomposedNetwork(covers: CoverSet): LogicNetwork | null {
  const n = covers.inputs.length;
  if (n > TRUTH_TABLE_MAX_INPUTS) return null;
  const space = new TableSpace(n);
  const d = new Decomposer(space);
  const roots = covers.outputs.map((o) => {
    const t = o.form === "sop" ? space.fromCubes(o.cubes) : space.not(space.fromCubes(o.cubes.map((c) => ({ value: (~c.value & c.mask) >>> 0, mask: c.mask }))));
    return d.output(t);
  });
  // Each leaf minimized over its own inputs; a leaf that is a whole output keeps that output's cover.
  const wholeOutput = new Map<number, number>();
  roots.forEach((r, k) => {
    if (r.kind === "leaf" && covers.outputs[k]!.form === "sop" && !wholeOutput.has(r.leaf)) wholeOutput.set(r.leaf, k);
  });
  const sops: Sop[] = d.leaves.map((leaf, i) => {
    const k = wholeOutput.get(i);
    return k !== undefined ? literalCubes(covers.outputs[k]!.cubes, n, false) : leafCover(space, leaf.table, leaf.support);
  });
  const nodes = extract(n, sops);
  const ex = new NodeExprs(n, nodes);
  const memo = new Map<DExpr, LogicExpr>();
  const conv = (e: DExpr): LogicExpr => {
    const hit = memo.get(e);
    if (hit) return hit;
    let out: LogicExpr;
    switch (e.kind) {
      case "const": out = e.value ? TRUE : FALSE; break;
      case "input": out = e; break;
      case "not": out = negate(conv(e.arg)); break;
      case "leaf": out = ex.node(e.leaf); break;
      default: out = { kind: e.kind, args: e.args.map(conv) };
    }
    memo.set(e, out);
    return out;
  };
  return { inputs: covers.inputs.slice(), outputs: covers.outputs.map((o, k) => ({ name: o.name, expr: conv(roots[k]!) })) };
}

/** An exact two-level cover of a leaf over its support, as literal cubes over all inputs. */
function leafCover(space: TableSpace, t: Uint32Array, support: number[]): Sop {
  const k = support.length;
  const on: Cube[] = [];
  for (let m = 0; m < 2 ** k; m++) {
    let full = 0;
    for (let j = 0; j < k; j++) if ((m >>> (k - 1 - j)) & 1) full |= 1 << (space.n - 1 - support[j]!);
    if (space.get(t, full >>> 0)) on.push(minterm(m, k));
  }
  const names = support.map((i) => `x${i}`);
  const r = minimize({ inputs: names, outputs: [{ name: "leaf", on, dc: [] }] });
  return r.outputs[0]!.cubes.map((c) => {
    const out: number[] = [];
    for (let j = 0; j < k; j++) {
      const bit = 1 << (k - 1 - j);
      if (c.mask & bit) out.push(2 * support[j]! + (c.value & bit ? 0 : 1));
    }
    return out;
  });
}

/**
 * Builds the structures, maps each (verified against `spec`) and keeps the
 * best by the aim. `covers` are the minimizer's; `options` go to the mapper.
 */
export function mapFactored(spec: FunctionSpec, covers: CoverSet, family: Parameters<typeof mapNetwork>[1], options: MapOptions & FactorOptions = {}): FactorResult {
  const aim = options.aim ?? "gates";
  const { twoLevel: _reuse, ...rest } = options;
  const mapOptions: MapOptions = { ...rest, spec, aim };
  const figuresOf = (m: MapResult) => {
    const chosen = m.realisations.find((r) => r.chosen)!;
    return { gates: chosen.gates, packages: chosen.packages, levels: chosen.depth };
  };
  const rank = (f: ReturnType<typeof figuresOf>) => (aim === "levels" ? [f.levels, f.gates, f.packages ?? 0] : [f.gates, f.packages ?? 0, f.levels]);
  /** Whether a ranks strictly before b (the first figure that differs decides). */
  const before = (a: number[], b: number[]) => {
    const k = a.findIndex((x, j) => x !== b[j]);
    return k >= 0 && a[k]! < b[k]!;
  };
  // The mapper's own gate choice follows the aim too, and is a heuristic: the other aim's choices
  // sometimes give a network fewer gates as well. Both are priced; the aim's own wins a tie.
  const other: MapOptions = { ...mapOptions, aim: aim === "gates" ? "levels" : "gates" };
  const mapBoth = (network: LogicNetwork): MapResult => {
    const own = mapNetwork(network, family, mapOptions);
    const alt = mapNetwork(network, family, other);
    return before(rank(figuresOf(alt)), rank(figuresOf(own))) ? alt : own;
  };
  // two-level first, so that it is kept on a tie
  const built: { structure: Structure; mapped: MapResult }[] = [];
  built.push({ structure: "two-level", mapped: options.twoLevel ?? mapNetwork(coverNetwork(covers), family, mapOptions) });
  const decomposed = decomposedNetwork(covers);
  if (decomposed) built.push({ structure: "decomposed", mapped: mapBoth(decomposed) });
  const cubes = covers.outputs.reduce((s, o) => s + o.cubes.length, 0);
  if (cubes <= ALGEBRAIC_MAX_CUBES) built.push({ structure: "algebraic", mapped: mapBoth(algebraicNetwork(covers)) });
  const figures = built.map((b) => figuresOf(b.mapped));
  let pick = 0;
  for (let i = 1; i < built.length; i++) if (before(rank(figures[i]!), rank(figures[pick]!))) pick = i;
  return {
    mapped: built[pick]!.mapped,
    structure: built[pick]!.structure,
    structures: built.map((b, i) => ({ structure: b.structure, ...figures[i]!, chosen: i === pick })),
    aim,
  };
}
