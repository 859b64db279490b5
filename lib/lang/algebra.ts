/**
 * The two representations a signal's value can take while elaborating:
 * bit-parallel truth tables over a chosen set of at most
 * TRUTH_TABLE_MAX_INPUTS design inputs, or cube lists over all inputs.
 */
import { LOW_VARIABLE_WORDS, emptyTable, fullMask, type Cube, type TruthTable } from "../logic/index";
import { cubesAnd, cubesNot, cubesOr, cubesXor, tableToCubes } from "./cubes";

export interface Algebra<V> {
  zero(): V;
  one(): V;
  /** The design input with 0-based declared index i. */
  input(i: number): V;
  not(a: V): V;
  and(a: V, b: V): V;
  or(a: V, b: V): V;
  xor(a: V, b: V): V;
  isZero(a: V): boolean;
  /** Some design minterm index where a is true, or null. */
  someMinterm(a: V): number | null;
  toCubes(a: V): Cube[];
}

/** Truth tables over the design inputs vars (ascending declared indices) out of n. */
export function tableAlgebra(vars: readonly number[], n: number): Algebra<TruthTable> {
  const k = vars.length;
  const words = emptyTable(k).length;
  const valid = k >= 5 ? 0xffffffff : (2 ** (2 ** k) - 1) >>> 0;
  const local = new Map<number, number>();
  vars.forEach((v, j) => local.set(v, j));
  const map = (f: (i: number) => number): TruthTable => {
    const t = new Uint32Array(words);
    for (let i = 0; i < words; i++) t[i] = f(i);
    t[words - 1] = (t[words - 1]! & valid) >>> 0;
    return t;
  };
  const cache = new Map<number, TruthTable>();
  return {
    zero: () => new Uint32Array(words),
    one: () => map(() => 0xffffffff),
    input(i) {
      const j = local.get(i);
      if (j === undefined) throw new Error(`internal: input ${i} outside the table's inputs`);
      let t = cache.get(j);
      if (!t) {
        const p = k - 1 - j;
        t = p < 5 ? map(() => LOW_VARIABLE_WORDS[p]!) : map((w) => ((w >>> (p - 5)) & 1 ? 0xffffffff : 0));
        cache.set(j, t);
      }
      return t;
    },
    not: (a) => map((i) => ~a[i]! >>> 0),
    and: (a, b) => map((i) => (a[i]! & b[i]!) >>> 0),
    or: (a, b) => map((i) => (a[i]! | b[i]!) >>> 0),
    xor: (a, b) => map((i) => (a[i]! ^ b[i]!) >>> 0),
    isZero: (a) => a.every((w) => w === 0),
    someMinterm(a) {
      for (let w = 0; w < a.length; w++) {
        const word = a[w]!;
        if (word === 0) continue;
        const m = w * 32 + (31 - Math.clz32(word & -word));
        let g = 0;
        for (let j = 0; j < k; j++) if ((m >>> (k - 1 - j)) & 1) g |= 1 << (n - 1 - vars[j]!);
        return g >>> 0;
      }
      return null;
    },
    toCubes: (a) => tableToCubes(a, vars, n),
  };
}

/** Cube lists over all n design inputs; every result is held under `limit` cubes. */
export function cubeAlgebra(n: number, limit: number): Algebra<Cube[]> {
  return {
    zero: () => [],
    one: () => [{ value: 0, mask: 0 }],
    input(i) {
      const bit = (1 << (n - 1 - i)) >>> 0;
      return [{ value: bit, mask: bit }];
    },
    not: (a) => cubesNot(a, n, limit),
    and: (a, b) => cubesAnd(a, b, limit),
    or: (a, b) => cubesOr(a, b, limit),
    xor: (a, b) => cubesXor(a, b, n, limit),
    isZero: (a) => a.length === 0,
    someMinterm: (a) => (a.length === 0 ? null : a[0]!.value & fullMask(n)),
    toCubes: (a) => a,
  };
}
