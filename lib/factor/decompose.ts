/**
 * Functional decomposition on truth tables (up to TRUTH_TABLE_MAX_INPUTS
 * inputs). Each function is taken apart by the first rule that applies:
 *
 * 1. Known function: a function (or its complement) built before — for
 *    another output or inside one — is reused, so equal sub-functions are
 *    shared across outputs.
 * 2. Resubstitution by two outputs: an output that is AND, OR or XOR of two
 *    outputs built before (with either polarity) is that gate (Boolean
 *    resubstitution, as in Brayton, Rudell, Sangiovanni-Vincentelli, Wang
 *    1987, here checked on whole truth tables).
 * 3. Exclusive-or: every input x with f|x=1 = ¬f|x=0 splits off as
 *    f = x ⊕ f|x=0; all such inputs together give f = x1 ⊕ … ⊕ xk ⊕ g with g
 *    free of them (the linear part of the function's Reed–Muller form).
 * 4. AND / OR with a literal: f|x=0 = 0 gives f = x·f|x=1 (f|x=1 = 0 gives
 *    f = x'·f|x=0); f|x=1 = 1 gives f = x + f|x=0 (f|x=0 = 1 gives f = x' + f|x=1).
 * 5. Two bound inputs (a disjoint decomposition in the sense of Ashenhurst
 *    1959 and Curtis 1962 with a bound set of two): over the four cofactors
 *    of f by a pair x, y, when at most two distinct cofactors are not
 *    constant, f = S1(x,y) + Σ Sg(x,y)·g, each selector S a function of x and
 *    y alone. Magnitude comparison (f = a·b' + (a ⊙ b)·f') and carries
 *    (c' = a·b + (a ⊕ b)·c) fall apart this way bit by bit.
 * 6. Otherwise the function is a leaf: it is minimized as a two-level cover
 *    and factored algebraically (./algebra).
 */
import type { TableSpace } from "./truth";

/** An expression of the decomposition; "leaf" stands for a function left to the algebraic stage. */
export type DExpr =
  | { kind: "const"; value: boolean }
  | { kind: "input"; index: number }
  | { kind: "not"; arg: DExpr }
  | { kind: "and" | "or" | "xor"; args: DExpr[] }
  | { kind: "leaf"; leaf: number };

export interface Leaf {
  table: Uint32Array;
  /** Inputs the leaf depends on, ascending. */
  support: number[];
}

const ONE: DExpr = { kind: "const", value: true };
const ZERO: DExpr = { kind: "const", value: false };
const not = (e: DExpr): DExpr => (e.kind === "const" ? (e.value ? ZERO : ONE) : e.kind === "not" ? e.arg : { kind: "not", arg: e });

export interface DecomposeOptions {
  /** Use the two-bound-input rule (5). Default true. */
  pairs?: boolean;
  /** Largest support the pair rule searches (pairs grow as its square). Default 20. */
  pairSupport?: number;
}

export class Decomposer {
  readonly leaves: Leaf[] = [];
  private known = new Map<number, { t: Uint32Array; e: DExpr }[]>();
  private outputs: { t: Uint32Array; e: DExpr }[] = [];
  private inputs: DExpr[];
  constructor(
    private readonly space: TableSpace,
    private readonly options: DecomposeOptions = {},
  ) {
    this.inputs = Array.from({ length: space.n }, (_, index): DExpr => ({ kind: "input", index }));
  }

  /** Decomposes an output's function; later outputs may reuse it (rules 1 and 2). */
  output(t: Uint32Array): DExpr {
    const hit = this.lookup(t) ?? this.resubstitute(t);
    const e = hit ?? this.build(t);
    this.outputs.push({ t, e });
    this.remember(t, e);
    return e;
  }

  private lookup(t: Uint32Array): DExpr | undefined {
    const s = this.space;
    for (const x of this.known.get(s.hash(t)) ?? []) if (s.equal(x.t, t)) return x.e;
    const c = s.not(t);
    for (const x of this.known.get(s.hash(c)) ?? []) if (s.equal(x.t, c)) return not(x.e);
    return undefined;
  }

  private remember(t: Uint32Array, e: DExpr): void {
    const h = this.space.hash(t);
    const list = this.known.get(h);
    if (list) {
      if (!list.some((x) => this.space.equal(x.t, t))) list.push({ t, e });
    } else this.known.set(h, [{ t, e }]);
  }

  /** Rule 2: f = g ∘ h for two earlier outputs g, h and a two-input AND, OR or XOR with either polarities. */
  private resubstitute(t: Uint32Array): DExpr | undefined {
    const s = this.space;
    const outs = this.outputs;
    for (let i = 0; i < outs.length; i++) {
      for (let j = i + 1; j < outs.length; j++) {
        const g = outs[i]!;
        const h = outs[j]!;
        for (const [pg, ph] of [[false, false], [false, true], [true, false], [true, true]] as const) {
          const tg = pg ? s.not(g.t) : g.t;
          const th = ph ? s.not(h.t) : h.t;
          const eg = pg ? not(g.e) : g.e;
          const eh = ph ? not(h.e) : h.e;
          if (s.equal(t, s.and(tg, th))) return { kind: "and", args: [eg, eh] };
          if (s.equal(t, s.or(tg, th))) return { kind: "or", args: [eg, eh] };
        }
        const x = s.xor(g.t, h.t);
        if (s.equal(t, x)) return { kind: "xor", args: [g.e, h.e] };
        if (s.complementary(t, x)) return not({ kind: "xor", args: [g.e, h.e] });
      }
    }
    return undefined;
  }

  /** Decomposes one function (rules 1, 3–6). */
  build(t: Uint32Array): DExpr {
    const s = this.space;
    if (s.isZero(t)) return ZERO;
    if (s.isOne(t)) return ONE;
    const hit = this.lookup(t);
    if (hit) return hit;
    const e = this.decompose(t);
    this.remember(t, e);
    return e;
  }

  private decompose(t: Uint32Array): DExpr {
    const s = this.space;
    const support = s.support(t);
    if (support.length <= 2) return this.small(t, support);

    // 3. exclusive-or with inputs
    {
      let rest = t;
      const xs: DExpr[] = [];
      for (const x of support) {
        const c0 = s.cofactor(rest, x, 0);
        if (s.complementary(c0, s.cofactor(rest, x, 1))) {
          xs.push(this.inputs[x]!);
          rest = c0;
        }
      }
      if (xs.length) {
        if (s.isZero(rest)) return { kind: "xor", args: xs };
        if (s.isOne(rest)) return not({ kind: "xor", args: xs });
        return { kind: "xor", args: [...xs, this.build(rest)] };
      }
    }
    // 4. AND / OR with literals
    for (const [absorbing, op] of [[false, "and"], [true, "or"]] as const) {
      let rest = t;
      const lits: DExpr[] = [];
      for (const x of support) {
        const c0 = s.cofactor(rest, x, 0);
        const c1 = s.cofactor(rest, x, 1);
        const fixed = (c: Uint32Array) => (absorbing ? s.isOne(c) : s.isZero(c));
        if (fixed(c0)) {
          // AND: f = x·f|x=1; OR: f = x' + f|x=1
          lits.push(absorbing ? not(this.inputs[x]!) : this.inputs[x]!);
          rest = c1;
        } else if (fixed(c1)) {
          lits.push(absorbing ? this.inputs[x]! : not(this.inputs[x]!));
          rest = c0;
        }
      }
      if (lits.length) {
        const r = this.build(rest);
        return r.kind === "const" ? (lits.length === 1 ? lits[0]! : { kind: op, args: lits }) : { kind: op, args: [...lits, r] };
      }
    }
    // 5. two bound inputs
    if ((this.options.pairs ?? true) && support.length <= (this.options.pairSupport ?? 20)) {
      const split = this.pair(t, support);
      if (split) return split;
    }
    // 6. leaf
    this.leaves.push({ table: t, support });
    return { kind: "leaf", leaf: this.leaves.length - 1 };
  }

  /** A function of at most two inputs, from its minterms over them (through build, so it is shared). */
  private small(t: Uint32Array, support: number[]): DExpr {
    const s = this.space;
    if (support.length === 1) {
      const x = support[0]!;
      return s.isOne(s.cofactor(t, x, 1)) ? this.inputs[x]! : not(this.inputs[x]!);
    }
    const [x, y] = support as [number, number];
    const v = (a: 0 | 1, b: 0 | 1) => s.isOne(s.cofactor(s.cofactor(t, x, a), y, b));
    return this.selector(x, y, (v(0, 0) ? 1 : 0) | (v(0, 1) ? 2 : 0) | (v(1, 0) ? 4 : 0) | (v(1, 1) ? 8 : 0));
  }

  /** The function of inputs x, y that is 1 on the minterms set in `set` (bit 2·x + y). */
  private selector(x: number, y: number, set: number): DExpr {
    const X = this.inputs[x]!;
    const Y = this.inputs[y]!;
    const lit = (e: DExpr, v: number) => (v ? e : not(e));
    const ones = [0, 1, 2, 3].filter((m) => (set >>> m) & 1);
    switch (ones.length) {
      case 0:
        return ZERO;
      case 4:
        return ONE;
      case 1:
        return { kind: "and", args: [lit(X, ones[0]! >>> 1), lit(Y, ones[0]! & 1)] };
      case 3: {
        const zero = [0, 1, 2, 3].find((m) => !((set >>> m) & 1))!;
        return { kind: "or", args: [lit(X, 1 - (zero >>> 1)), lit(Y, 1 - (zero & 1))] };
      }
      default: {
        if (set === 0b1100) return X;
        if (set === 0b0011) return not(X);
        if (set === 0b1010) return Y;
        if (set === 0b0101) return not(Y);
        const xor: DExpr = { kind: "xor", args: [X, Y] };
        const t = this.space.xor(this.space.input(x), this.space.input(y));
        const known = this.lookup(t);
        const e = known ?? xor;
        if (!known) this.remember(t, xor);
        return set === 0b0110 ? e : not(e);
      }
    }
  }

  /** Rule 5: the pair whose cofactors have the fewest distinct non-constant functions, when that is at most two. */
  private pair(t: Uint32Array, support: number[]): DExpr | undefined {
    const s = this.space;
    const half = new Map<number, [Uint32Array, Uint32Array]>();
    for (const x of support) half.set(x, [s.cofactor(t, x, 0), s.cofactor(t, x, 1)]);
    let best: { x: number; y: number; groups: { t: Uint32Array; set: number }[]; ones: number } | undefined;
    for (let a = 0; a < support.length; a++) {
      for (let b = a + 1; b < support.length; b++) {
        const x = support[a]!;
        const y = support[b]!;
        const groups: { t: Uint32Array; set: number }[] = [];
        let ones = 0;
        let ok = true;
        for (let m = 0; m < 4 && ok; m++) {
          const c = s.cofactor(half.get(x)![m >>> 1]!, y, (m & 1) as 0 | 1);
          if (s.isZero(c)) continue;
          if (s.isOne(c)) {
            ones |= 1 << m;
            continue;
          }
          const g = groups.find((q) => s.equal(q.t, c));
          if (g) g.set |= 1 << m;
          else if (groups.length < 2) groups.push({ t: c, set: 1 << m });
          else ok = false;
        }
        if (!ok || groups.length === 0) continue;
        if (!best || groups.length < best.groups.length) best = { x, y, groups, ones };
        if (best.groups.length === 1) break;
      }
      if (best?.groups.length === 1) break;
    }
    if (!best) return undefined;
    const terms: DExpr[] = [];
    if (best.ones) terms.push(this.selector(best.x, best.y, best.ones));
    for (const g of best.groups) {
      const sel = this.selector(best.x, best.y, g.set);
      const sub = this.build(g.t);
      terms.push(sel.kind === "const" ? sub : { kind: "and", args: [sel, sub] });
    }
    return terms.length === 1 ? terms[0]! : { kind: "or", args: terms };
  }
}
