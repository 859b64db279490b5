/**
 * Shared Boolean representation used by every pipeline stage.
 *
 * Bit order: the first declared input is the most significant bit of a
 * minterm index, so for inputs (a, b, c) the minterm 6 is a=1, b=1, c=0.
 * A cube over n inputs stores input i (0-based, declared order) at bit
 * (n - 1 - i). `mask` has a 1 where the literal is present; `value` holds the
 * literal's polarity there (1 = plain, 0 = complemented) and is 0 elsewhere.
 * Designs are limited to MAX_INPUTS inputs so that cubes fit 32-bit words.
 */
export const MAX_INPUTS = 30;
/** Truth tables (bit-parallel, one bit per minterm) are used up to this many inputs. */
export const TRUTH_TABLE_MAX_INPUTS = 20;

export interface Cube {
  value: number;
  mask: number;
}

/** One output's specification: ON-set and DC-set as cube lists over the design's inputs. */
export interface OutputSpec {
  name: string;
  on: Cube[];
  dc: Cube[];
}

/** What elaboration hands the minimizer: inputs in declared order and each output's sets. */
export interface FunctionSpec {
  inputs: string[];
  outputs: OutputSpec[];
}

export function fullMask(n: number): number {
  return n >= 32 ? 0xffffffff : ((1 << n) >>> 0) - 1;
}

export function minterm(index: number, n: number): Cube {
  return { value: index >>> 0, mask: fullMask(n) };
}

export function literalCount(c: Cube): number {
  return popcount(c.mask);
}

export function popcount(x: number): number {
  x = x >>> 0;
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** Cube as a string over the inputs in declared order: '1' plain, '0' complemented, '-' absent. */
export function cubeToString(c: Cube, n: number): string {
  let s = "";
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    s += c.mask & bit ? (c.value & bit ? "1" : "0") : "-";
  }
  return s;
}

export function cubeFromString(s: string): Cube {
  const n = s.length;
  let value = 0;
  let mask = 0;
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (s[i] === "1") {
      value |= bit;
      mask |= bit;
    } else if (s[i] === "0") {
      mask |= bit;
    } else if (s[i] !== "-") {
      throw new Error(`cube "${s}": character ${i + 1} must be 0, 1 or -`);
    }
  }
  return { value: value >>> 0, mask: mask >>> 0 };
}

/** True when minterm m lies in cube c. */
export function cubeContains(c: Cube, m: number): boolean {
  return ((m ^ c.value) & c.mask) === 0;
}

/** True when cube a contains cube b entirely. */
export function cubeCovers(a: Cube, b: Cube): boolean {
  return (a.mask & ~b.mask) === 0 && ((a.value ^ b.value) & a.mask) === 0;
}

/** Intersection of two cubes, or null when they are disjoint. */
export function cubeIntersect(a: Cube, b: Cube): Cube | null {
  if (((a.value ^ b.value) & a.mask & b.mask) !== 0) return null;
  return { value: (a.value | b.value) >>> 0, mask: (a.mask | b.mask) >>> 0 };
}

/**
 * A bit-parallel truth table over n ≤ TRUTH_TABLE_MAX_INPUTS inputs:
 * bit m of the table (word m >>> 5, bit m & 31) is the value at minterm m.
 */
export type TruthTable = Uint32Array;

export function emptyTable(n: number): TruthTable {
  if (n > TRUTH_TABLE_MAX_INPUTS) {
    throw new Error(`truth tables stop at ${TRUTH_TABLE_MAX_INPUTS} inputs; ${n} were asked for`);
  }
  return new Uint32Array(Math.max(1, (2 ** n) >>> 5));
}

export function tableGet(t: TruthTable, m: number): boolean {
  return ((t[m >>> 5]! >>> (m & 31)) & 1) === 1;
}

/**
 * The table word of each of the low five variables (bits 0..4 of the minterm
 * index), which pick positions inside a 32-bit word of a truth table: bit b
 * of LOW_VARIABLE_WORDS[i] is 1 exactly when bit i of b is 1, so the word of
 * variable i is 1 where it is 1, and its complement (~word >>> 0) where it is
 * 0. Variables 5 and up pick whole words. The one copy in the pipeline
 * (lib/verify keeps its own, for independence).
 */
export const LOW_VARIABLE_WORDS: readonly number[] = Object.freeze([0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000]);

/**
 * Set every minterm of the cube in the table. Works a word at a time: the
 * cube's low five literals give one 32-bit pattern, its higher free variables
 * enumerate the words that receive it.
 */
export function tableAddCube(t: TruthTable, c: Cube, n: number): void {
  const full = fullMask(n);
  if (c.mask === full) {
    // A minterm: one bit.
    const m = (c.value & full) >>> 0;
    t[m >>> 5]! |= 1 << (m & 31);
    return;
  }
  let pattern = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
  // Only the mask's positions are literals (a value bit elsewhere means nothing, as in cubeContains).
  const value = (c.value & c.mask) >>> 0;
  for (let i = 0; i < 5 && i < n; i++) {
    if (!((c.mask >>> i) & 1)) continue;
    pattern &= (value >>> i) & 1 ? LOW_VARIABLE_WORDS[i]! : ~LOW_VARIABLE_WORDS[i]!;
  }
  const free = ((full & ~c.mask) >>> 5) >>> 0;
  const base = value >>> 5;
  // Enumerate subsets of the free word-index bits.
  let sub = 0;
  for (;;) {
    t[base | sub]! |= pattern;
    if (sub === free) break;
    sub = ((sub - free) & free) >>> 0;
  }
}

export function tableFromCubes(cubes: readonly Cube[], n: number): TruthTable {
  const t = emptyTable(n);
  for (const c of cubes) tableAddCube(t, c, n);
  return t;
}

/** Minterm indices set in the table, ascending. */
export function tableMinterms(t: TruthTable, n: number): number[] {
  const out: number[] = [];
  const size = 2 ** n;
  for (let w = 0; w < t.length; w++) {
    let word = t[w]!;
    while (word !== 0) {
      const b = 31 - Math.clz32(word & -word);
      const m = w * 32 + b;
      if (m < size) out.push(m);
      word &= word - 1;
    }
  }
  return out;
}
