/** Benchmark functions: seeded random ones and structured ones built from their arithmetic. */
import type { Cube, FunctionSpec } from "../logic";
import { minterm } from "../logic";

/** mulberry32: small, fast, seedable. */
export function prng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface BenchCase {
  name: string;
  kind: "random" | "structured" | "wide";
  spec: FunctionSpec;
  /** Heuristic only (the setting). */
  heuristic?: boolean;
  /** The known minimum in products, where the case has one. */
  minimum?: number;
}

export function randomCase(n: number, seed: number, pOn = 0.4, pDc = 0.1): BenchCase {
  const r = prng(seed * 7919 + n);
  const on: Cube[] = [];
  const dc: Cube[] = [];
  for (let m = 0; m < 2 ** n; m++) {
    const x = r();
    if (x < pOn) on.push(minterm(m, n));
    else if (x < pOn + pDc) dc.push(minterm(m, n));
  }
  return {
    name: `random ${n} #${seed}`,
    kind: "random",
    spec: { inputs: Array.from({ length: n }, (_, i) => `x${i}`), outputs: [{ name: "f", on, dc }] },
  };
}

/** Builds a spec from a per-minterm evaluator returning output bits (bit k = output k), or null for don't-care. */
function fromTable(name: string, inputs: string[], outputs: string[], f: (m: number) => number | null): BenchCase {
  const n = inputs.length;
  const on: Cube[][] = outputs.map(() => []);
  const dc: Cube[][] = outputs.map(() => []);
  for (let m = 0; m < 2 ** n; m++) {
    const v = f(m);
    for (let k = 0; k < outputs.length; k++) {
      if (v === null) dc[k]!.push(minterm(m, n));
      else if ((v >>> k) & 1) on[k]!.push(minterm(m, n));
    }
  }
  return { name, kind: "structured", spec: { inputs, outputs: outputs.map((o, k) => ({ name: o, on: on[k]!, dc: dc[k]! })) } };
}

const bits = (p: string, w: number) => Array.from({ length: w }, (_, i) => `${p}${w - 1 - i}`);

/** Ripple-free adder of two w-bit numbers and a carry in: outputs s0..s(w-1), cout. */
export function adder(w: number): BenchCase {
  // Inputs a(w) b(w) cin; outputs s0..s(w-1), cout.
  return fromTable(`adder ${w}-bit`, [...bits("a", w), ...bits("b", w), "cin"], [...Array.from({ length: w }, (_, i) => `s${i}`), "cout"], (m) => {
    const cin = m & 1;
    const b = (m >>> 1) & ((1 << w) - 1);
    const a = m >>> (w + 1);
    return a + b + cin;
  });
}

function multiplier(w: number): BenchCase {
  return fromTable(`multiplier ${w}x${w}`, [...bits("a", w), ...bits("b", w)], Array.from({ length: 2 * w }, (_, i) => `p${i}`), (m) => {
    const b = m & ((1 << w) - 1);
    const a = m >>> w;
    return a * b;
  });
}

/** Magnitude comparator of two w-bit numbers: outputs gt, eq, lt. */
export function comparator(w: number): BenchCase {
  return fromTable(`comparator ${w}-bit`, [...bits("a", w), ...bits("b", w)], ["gt", "eq", "lt"], (m) => {
    const b = m & ((1 << w) - 1);
    const a = m >>> w;
    return a > b ? 1 : a === b ? 2 : 4;
  });
}

/** Odd parity of n inputs. */
export function parity(n: number): BenchCase {
  return fromTable(`parity ${n}`, bits("x", n), ["p"], (m) => {
    let p = 0;
    for (let x = m; x; x &= x - 1) p ^= 1;
    return p;
  });
}

function sevenSegment(): BenchCase {
  // Segments a..g for digits 0..9 (common segment encoding, 6 with its top bar, 7 without, 9 with d); 10..15 don't-care.
  const seg = [0x3f, 0x06, 0x5b, 0x4f, 0x66, 0x6d, 0x7d, 0x07, 0x7f, 0x6f];
  return fromTable("BCD to 7-segment", ["l3", "l2", "l1", "l0"], ["sa", "sb", "sc", "sd", "se", "sf", "sg"], (m) => (m < 10 ? seg[m]! : null));
}

function priority(lines: number): BenchCase {
  // Highest-numbered active line wins; outputs the code bits and a valid flag.
  const w = Math.ceil(Math.log2(lines));
  const names = Array.from({ length: lines }, (_, i) => `f${lines - 1 - i}`);
  return fromTable(`priority encoder ${lines}`, names, [...Array.from({ length: w }, (_, i) => `q${i}`), "valid"], (m) => {
    if (m === 0) return 0;
    const top = 31 - Math.clz32(m);
    return top | (1 << w);
  });
}

/** 2^selBits-to-1 multiplexer. */
export function mux(selBits: number): BenchCase {
  const k = 2 ** selBits;
  return fromTable(`multiplexer ${k}:1`, [...bits("s", selBits), ...bits("d", k)], ["y"], (m) => {
    const data = m & ((1 << k) - 1);
    const sel = m >>> k;
    return (data >>> sel) & 1;
  });
}

export function structuredCases(): BenchCase[] {
  return [
    sevenSegment(),
    adder(2),
    adder(3),
    adder(4),
    multiplier(2),
    multiplier(3),
    multiplier(4),
    comparator(3),
    comparator(4),
    comparator(6),
    parity(8),
    parity(12),
    parity(16),
    priority(8),
    priority(12),
    priority(16),
    mux(2),
    mux(3),
  ];
}

/**
 * "Not all inputs equal" over n inputs, as the equation language writes
 * (x0 + … + x(n−1)) · (x0' + … + x(n−1)'): the products xi·xj' for i ≠ j.
 * Its minimum is the n products x0·x1' + x1·x2' + … + x(n−1)·x0' (a product
 * needs a plain and a complemented literal, and the n points with one input
 * at 1 need n different products).
 */
function notAllEqual(n: number): BenchCase {
  const inputs = Array.from({ length: n }, (_, i) => `x${i}`);
  const on: Cube[] = [];
  // Input i is bit n − 1 − i of a minterm (lib/logic).
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const bi = 2 ** (n - 1 - i);
      const bj = 2 ** (n - 1 - j);
      on.push({ value: bi, mask: (bi + bj) >>> 0 });
    }
  }
  return { name: `not all equal ${n}`, kind: "wide", spec: { inputs, outputs: [{ name: "d", on, dc: [] }] }, minimum: n };
}

/** Wide structured functions: "not all equal" of 16 to 30 inputs, and an 18-input parity on the heuristic alone. */
export function wideCases(): BenchCase[] {
  const parity18 = parity(18);
  return [
    ...[16, 18, 20, 24, 30].map(notAllEqual),
    { ...parity18, name: "parity 18 (heuristic)", kind: "wide", heuristic: true, minimum: 2 ** 17 },
  ];
}
