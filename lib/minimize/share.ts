/**
 * Terms shared among outputs: a distinct term is paid once whatever the
 * outputs it serves. Turns a chosen set of multi-output primes into
 * per-output covers, prices covers, and counts the shared terms.
 */
import type { Cube } from "../logic";
import { popcount } from "../logic";
import { designCost } from "./cost";
import type { CoveringProblem } from "./problem";
import type { CostModel } from "./types";

/**
 * Distinct terms of one or more covers: open addressing on (mask, value),
 * which fit 30 bits each. Covers of tens of thousands of terms make a Map or
 * a sort the slow part of pricing them.
 */
export class TermTable {
  /** Slot i holds mask + 1 at 2i (0 when free) and value at 2i + 1. */
  private readonly cells: Int32Array;
  private readonly shift: number;
  /** Literal count of every distinct term, in the order first seen. */
  readonly literals: number[] = [];

  constructor(capacity: number) {
    // More than twice as many slots as terms.
    const bits = Math.max(4, 33 - Math.clz32(capacity));
    this.shift = 32 - bits;
    this.cells = new Int32Array(2 << bits);
  }

  /** Number of slots: slot() returns indices below it. */
  get slots(): number {
    return this.cells.length >>> 1;
  }

  /** Slot of the term; a new term takes a free slot. */
  slot(c: Cube): number {
    const cells = this.cells;
    const last = (cells.length >>> 1) - 1;
    const mask = c.mask | 0;
    const value = c.value | 0;
    let i = Math.imul(mask ^ Math.imul(value, 0x85ebca6b), 0x9e3779b1) >>> this.shift;
    for (;;) {
      const m = cells[2 * i]!;
      if (m === 0) {
        cells[2 * i] = mask + 1;
        cells[2 * i + 1] = value;
        this.literals.push(popcount(mask));
        return i;
      }
      if (m === mask + 1 && cells[2 * i + 1] === value) return i;
      i = (i + 1) & last;
    }
  }
}

/**
 * Per output, drop chosen terms that the output's other terms already cover,
 * costliest first (ties in the order chosen). Works on the rows of the
 * covering problem: the rows of output j that column c covers are its ON
 * points of output j. Rows of different outputs are disjoint, so one pass in
 * the global order makes, for each output, the decisions its own pass would.
 * Also returns the literal count of each term kept by some output: the
 * columns are distinct primes, so these are the design's distinct terms.
 */
export function assignTerms(
  n: number,
  k: number,
  prob: CoveringProblem & { rowsPerOutput: number[] },
  chosen: number[],
): { covers: Cube[][]; literals: number[] } {
  const { colRows, rowCount } = prob;
  const rowOutput = new Uint8Array(rowCount);
  for (let j = 0, r = 0; j < k; j++) for (let e = r + prob.rowsPerOutput[j]!; r < e; r++) rowOutput[r] = j;
  // count[r]: chosen terms, not yet dropped for r's output, that cover row r.
  const count = new Int32Array(rowCount);
  const lits = new Int32Array(chosen.length);
  for (let i = 0; i < chosen.length; i++) {
    const rs = colRows[chosen[i]!]!;
    for (let x = 0; x < rs.length; x++) count[rs[x]!]!++;
    lits[i] = popcount(prob.columns[chosen[i]!]!.mask);
  }
  // Stable order by literals, most first (a counting sort: ties keep the chosen order).
  const bucket = new Int32Array(n + 2);
  for (let i = 0; i < lits.length; i++) bucket[n - lits[i]! + 1]!++;
  for (let l = 0; l <= n; l++) bucket[l + 1]! += bucket[l]!;
  const order = new Int32Array(chosen.length);
  for (let i = 0; i < chosen.length; i++) order[bucket[n - lits[i]!]!++] = i;
  // dropped[i]: outputs (bits) for which the i-th chosen term is redundant.
  const dropped = new Int32Array(chosen.length);
  const outputs = k >= 31 ? 0x7fffffff : (1 << k) - 1;
  for (let q = 0; q < order.length; q++) {
    const i = order[q]!;
    const rs = colRows[chosen[i]!]!;
    const tag = prob.columns[chosen[i]!]!.tag & outputs;
    // Outputs for which the term covers a row no other kept term covers; once all its outputs, nothing to drop.
    let needed = 0;
    for (let x = 0; x < rs.length && needed !== tag; x++) if (count[rs[x]!]! <= 1) needed |= 1 << rowOutput[rs[x]!]!;
    const drop = tag & ~needed;
    if (drop === 0) continue;
    dropped[i] = drop;
    for (let x = 0; x < rs.length; x++) if ((drop >>> rowOutput[rs[x]!]!) & 1) count[rs[x]!]!--;
  }
  const covers: Cube[][] = Array.from({ length: k }, () => []);
  const literals: number[] = [];
  for (let i = 0; i < chosen.length; i++) {
    const p = prob.columns[chosen[i]!]!;
    const kept = p.tag & outputs & ~dropped[i]!;
    if (kept !== 0) literals.push(lits[i]!);
    for (let keep = kept; keep !== 0; keep &= keep - 1) {
      covers[31 - Math.clz32(keep & -keep)]!.push({ value: p.value, mask: p.mask });
    }
  }
  return { covers, literals };
}

export function costOfCovers(model: CostModel, covers: Cube[][]): number {
  let total = 0;
  for (const cv of covers) total += cv.length;
  const terms = new TermTable(total);
  for (const cv of covers) for (let i = 0; i < cv.length; i++) terms.slot(cv[i]!);
  return designCost(model, terms.literals, covers.map((c) => c.length));
}

/** Terms used by more than one output (each term counted once per output that uses it). */
export function sharedTerms(covers: Cube[][]): number {
  let shared = 0;
  if (covers.length <= 1) return 0;
  const terms = new TermTable(covers.reduce((a, cv) => a + cv.length, 0));
  const lastOutput = new Int32Array(terms.slots).fill(-1);
  const uses = new Int32Array(terms.slots);
  covers.forEach((cv, j) => {
    for (const c of cv) {
      const s = terms.slot(c);
      if (lastOutput[s] === j) continue;
      lastOutput[s] = j;
      if (++uses[s]! === 2) shared++;
    }
  });
  return shared;
}
