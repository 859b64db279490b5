/**
 * Unate-recursive complementation and tautology on cube lists (Brayton,
 * Hachtel, McMullen and Sangiovanni-Vincentelli, "Logic Minimization
 * Algorithms for VLSI Synthesis", 1984): split on the most binate variable,
 * recurse on the two cofactors, and stop early on unate or single-cube lists.
 * Cubes are the shared {value, mask} patterns; `space` is the mask of the
 * variables in play.
 */
import type { Cube } from "../logic";
import { popcount } from "../logic";

export function cofactorLiteral(F: readonly Cube[], bit: number, positive: boolean): Cube[] {
  const out: Cube[] = [];
  const want = positive ? bit : 0;
  for (const c of F) {
    if (c.mask & bit) {
      if ((c.value & bit) !== want) continue;
      out.push({ value: (c.value & ~bit) >>> 0, mask: (c.mask & ~bit) >>> 0 });
    } else out.push(c);
  }
  return out;
}

/** Cofactor of F with respect to cube c: cubes meeting c, with c's literals dropped. */
export function cofactorCube(F: readonly Cube[], c: Cube): Cube[] {
  const out: Cube[] = [];
  for (const d of F) {
    if (((d.value ^ c.value) & d.mask & c.mask) !== 0) continue;
    out.push({ value: (d.value & ~c.mask) >>> 0, mask: (d.mask & ~c.mask) >>> 0 });
  }
  return out;
}

/** Most binate variable of F, or the most frequent one when F is unate; 0 when no literal appears. */
function splitBit(F: readonly Cube[], space: number): { bit: number; binate: boolean } {
  let bestBit = 0;
  let bestScore = -1;
  let binate = false;
  let bits = space;
  while (bits !== 0) {
    const b = bits & -bits;
    bits ^= b;
    let ones = 0;
    let zeros = 0;
    for (const c of F) {
      if (c.mask & b) {
        if (c.value & b) ones++;
        else zeros++;
      }
    }
    if (ones + zeros === 0) continue;
    const isBinate = ones > 0 && zeros > 0;
    const score = (isBinate ? 1e6 : 0) + ones + zeros;
    if (score > bestScore) {
      bestScore = score;
      bestBit = b >>> 0;
      binate = isBinate;
    }
  }
  return { bit: bestBit, binate };
}

/**
 * Complement of the union of F within the variables of `space`. With a
 * budget, each call charges COST.cube per cube of its list and throws
 * {@link OverBudget} when the allowance runs out.
 */
export function complement(F: readonly Cube[], space: number, budget?: WorkBudget): Cube[] {
  budget?.spend(COST.cube * (F.length + 1));
  if (F.length === 0) return [{ value: 0, mask: 0 }];
  for (const c of F) if ((c.mask & space) === 0) return [];
  if (F.length === 1) {
    const c = F[0]!;
    const out: Cube[] = [];
    let bits = c.mask & space;
    while (bits !== 0) {
      const b = bits & -bits;
      bits ^= b;
      out.push({ value: (~c.value & b) >>> 0, mask: b >>> 0 });
    }
    return out;
  }
  const { bit } = splitBit(F, space);
  const rest = (space & ~bit) >>> 0;
  const c1 = complement(cofactorLiteral(F, bit, true), rest, budget);
  const c0 = complement(cofactorLiteral(F, bit, false), rest, budget);
  // A cube in both halves needs no literal of the split variable. Cubes are keyed by mask, then value:
  // one number of both would pass 2^53 for masks of 23 bits and more, and distinct cubes would collide.
  const in0 = new Map<number, Set<number>>();
  for (const c of c0) {
    let vs = in0.get(c.mask);
    if (!vs) in0.set(c.mask, (vs = new Set()));
    vs.add(c.value);
  }
  const both = new Map<number, Set<number>>();
  const out: Cube[] = [];
  for (const c of c1) {
    if (in0.get(c.mask)?.has(c.value)) {
      let vs = both.get(c.mask);
      if (!vs) both.set(c.mask, (vs = new Set()));
      vs.add(c.value);
      out.push(c);
    } else out.push({ value: (c.value | bit) >>> 0, mask: (c.mask | bit) >>> 0 });
  }
  for (const c of c0) if (!both.get(c.mask)?.has(c.value)) out.push({ value: c.value, mask: (c.mask | bit) >>> 0 });
  return out.length > 64 ? out : removeContained(out);
}

/** True when F covers every point of the variables in `space`. */
export function tautology(F: readonly Cube[], space: number): boolean {
  if (F.length === 0) return false;
  const n = popcount(space);
  let volume = 0;
  for (const c of F) {
    if ((c.mask & space) === 0) return true;
    volume += 2 ** (n - popcount(c.mask & space));
  }
  if (volume < 2 ** n) return false;
  const { bit, binate } = splitBit(F, space);
  // A unate list without the universal cube misses the corner opposite its literals.
  if (!binate) return false;
  const rest = (space & ~bit) >>> 0;
  return tautology(cofactorLiteral(F, bit, true), rest) && tautology(cofactorLiteral(F, bit, false), rest);
}

/**
 * A work allowance shared by nested calls, in units of about a nanosecond
 * (see {@link COST}): callers that have another route at hand stop the
 * recursive rule when it runs past what that route would cost.
 */
export class WorkBudget {
  constructor(public left: number) {}
  spend(units: number): void {
    this.left -= units;
    if (this.left < 0) throw new OverBudget();
  }
}

/**
 * What the steps of {@link primesOfCover} cost in budget units, fitted to its
 * running times on functions of 11 to 16 inputs (V8; within a factor 2):
 * a cube entering a call (cofactors, split choice, the call itself), a pair
 * of cubes tested for intersection, a product kept (allocated, deduplicated),
 * a containment test, and per variable a block of a compact cover (found
 * by its walk over the truth table, then merged by {@link mergeLists}).
 */
export const COST = { cube: 200, pair: 3, product: 50, test: 2, merge: 14 };

/** Thrown by {@link WorkBudget.spend} when the allowance is used up; caught by the caller, which takes another route. */
export class OverBudget extends Error {
  constructor() {
    // Without a stack trace: it is thrown on every function the recursive rule gives up on, and never shown.
    const limit = Error.stackTraceLimit;
    Error.stackTraceLimit = 0;
    super("work budget exhausted");
    Error.stackTraceLimit = limit;
  }
}

/**
 * Drops cubes contained in another cube of the list, charging its
 * comparisons to `budget`. Largest cubes first, so a cube is only compared
 * with kept ones; equal sizes keep their order.
 */
export function removeContained(F: readonly Cube[], budget?: WorkBudget): Cube[] {
  const len = F.length;
  if (len < 2) return F.slice();
  if (len <= 16) return removeContainedSmall(F, budget);
  // Stable counting sort by literal count.
  const lits = new Uint8Array(len);
  const start = new Int32Array(34);
  for (let i = 0; i < len; i++) {
    const l = popcount(F[i]!.mask);
    lits[i] = l;
    start[l + 1]!++;
  }
  for (let l = 0; l < 33; l++) start[l + 1]! += start[l]!;
  const order = new Int32Array(len);
  for (let i = 0; i < len; i++) order[start[lits[i]!]!++] = i;
  if (!budget) return removeContainedByMask(F, order);
  // The kept cubes' masks and values side by side, for the inner loop.
  const keptMask = new Int32Array(len);
  const keptValue = new Int32Array(len);
  const out: Cube[] = [];
  let work = len;
  for (let o = 0; o < len; o++) {
    const c = F[order[o]!]!;
    const cm = c.mask | 0;
    const cv = c.value | 0;
    const kept = out.length;
    let k = 0;
    while (k < kept && ((keptMask[k]! & ~cm) !== 0 || ((keptValue[k]! ^ cv) & keptMask[k]!) !== 0)) k++;
    work += k;
    if (k < kept) continue;
    keptMask[kept] = cm;
    keptValue[kept] = cv;
    out.push(c);
  }
  budget?.spend(work * COST.test);
  return out;
}

/**
 * {@link removeContained} without a budget to charge: the kept cubes grouped
 * by mask, so that a cube is tested against each kept mask inside its own
 * (one lookup of its value on that mask) rather than against each kept cube.
 * Lists of many cubes of few masks (a parity function's minterms: one mask)
 * then cost a lookup a cube. Same result, same order.
 */
function removeContainedByMask(F: readonly Cube[], order: Int32Array): Cube[] {
  const byMask = new Map<number, Set<number>>();
  const masks: number[] = [];
  const out: Cube[] = [];
  for (let o = 0; o < order.length; o++) {
    const c = F[order[o]!]!;
    const cm = c.mask >>> 0;
    const cv = c.value >>> 0;
    let inside = false;
    for (let k = 0; k < masks.length && !inside; k++) {
      const m = masks[k]!;
      if ((m & ~cm) !== 0) continue;
      inside = byMask.get(m)!.has((cv & m) >>> 0);
    }
    if (inside) continue;
    let values = byMask.get(cm);
    if (!values) {
      values = new Set<number>();
      byMask.set(cm, values);
      masks.push(cm);
    }
    values.add((cv & cm) >>> 0);
    out.push(c);
  }
  return out;
}

/** {@link removeContained} for short lists: no tables to set up. */
function removeContainedSmall(F: readonly Cube[], budget?: WorkBudget): Cube[] {
  const sorted = F.slice();
  // Insertion sort by literal count (stable).
  for (let i = 1; i < sorted.length; i++) {
    const c = sorted[i]!;
    const l = popcount(c.mask);
    let k = i;
    while (k > 0 && popcount(sorted[k - 1]!.mask) > l) {
      sorted[k] = sorted[k - 1]!;
      k--;
    }
    sorted[k] = c;
  }
  const out: Cube[] = [];
  let work = F.length;
  for (const c of sorted) {
    let k = 0;
    while (k < out.length && ((out[k]!.mask & ~c.mask) !== 0 || ((out[k]!.value ^ c.value) & out[k]!.mask) !== 0)) k++;
    work += k;
    if (k === out.length) out.push(c);
  }
  budget?.spend(work * COST.test);
  return out;
}

/**
 * All prime implicants of the function covered by F, by the recursive
 * (Shannon) rule P(f) = ABS(x·P(f_x) ∪ x'·P(f_x') ∪ P(f_x)·P(f_x')), where
 * ABS drops cubes contained in others; a unate cover's primes are its
 * maximal cubes. Throws RangeError when an intermediate set exceeds `cap`,
 * and {@link OverBudget} when `budget` runs out.
 */
export function primesOfCover(F: readonly Cube[], space: number, cap = Infinity, budget?: WorkBudget): Cube[] {
  if (F.length === 0) return [];
  for (const c of F) if ((c.mask & space) === 0) return [{ value: 0, mask: 0 }];
  budget?.spend(F.length * COST.cube);
  const { bit, binate } = splitBit(F, space);
  if (!binate) return removeContained(F, budget);
  const rest = (space & ~bit) >>> 0;
  const P1 = primesOfCover(cofactorLiteral(F, bit, true), rest, cap, budget);
  const P0 = primesOfCover(cofactorLiteral(F, bit, false), rest, cap, budget);
  // The products p·q carry no literal of x, so only other products can contain them; x·p lies in a
  // product only when some q contains p (the product is then p itself), and likewise x'·q.
  budget?.spend(P1.length * P0.length * COST.pair);
  const covered1 = new Uint8Array(P1.length);
  const covered0 = new Uint8Array(P0.length);
  const products: Cube[] = [];
  // Keys mask·2^w + value, w the width of `rest`: small integers (fast set keys) up to 15 inputs, exact
  // up to 26; wider, the key is mask·2^w + value only if it stays below 2^53, else a key per mask.
  const scale = 2 ** (32 - Math.clz32(rest));
  const exactKeys = scale * scale <= 2 ** 53;
  const seen = new Set<number>();
  const seenWide = new Map<number, Set<number>>();
  for (let i = 0; i < P1.length; i++) {
    const p = P1[i]!;
    for (let k = 0; k < P0.length; k++) {
      const q = P0[k]!;
      if (((p.value ^ q.value) & p.mask & q.mask) !== 0) continue;
      const mask = (p.mask | q.mask) >>> 0;
      if (mask === p.mask) covered1[i] = 1;
      if (mask === q.mask) covered0[k] = 1;
      const value = (p.value | q.value) >>> 0;
      if (exactKeys) {
        const key = mask * scale + value;
        if (seen.has(key)) continue;
        seen.add(key);
      } else {
        let values = seenWide.get(mask);
        if (!values) seenWide.set(mask, (values = new Set<number>()));
        if (values.has(value)) continue;
        values.add(value);
      }
      products.push({ value, mask });
    }
    if (products.length > cap) throw new RangeError(`more than ${cap} candidate primes`);
  }
  budget?.spend(products.length * COST.product);
  const out = removeContained(products, budget);
  for (let i = 0; i < P1.length; i++) {
    const p = P1[i]!;
    if (covered1[i] === 0) out.push({ value: (p.value | bit) >>> 0, mask: (p.mask | bit) >>> 0 });
  }
  for (let k = 0; k < P0.length; k++) {
    const q = P0[k]!;
    if (covered0[k] === 0) out.push({ value: q.value, mask: (q.mask | bit) >>> 0 });
  }
  if (out.length > cap) throw new RangeError(`more than ${cap} candidate primes`);
  return out;
}

/**
 * Merges a disjoint cube list, given as its values and masks (both consumed),
 * along each variable in turn (pairs equal but for that variable become one
 * cube). The union is unchanged; lists of minterms of functions with large
 * cubes shrink by orders of magnitude.
 */
export function mergeLists(values: number[], masks: number[], n: number): Cube[] {
  // An open-addressing table of the cubes with the positive literal of the variable at hand (index + 1;
  // 0 empty), hashed on mask and value: a partner with the negative literal absorbs them.
  let bits = 4;
  while (1 << bits < 2 * values.length) bits++;
  const slots = new Int32Array(1 << bits);
  const slotMask = (1 << bits) - 1;
  const hash = (mask: number, value: number) => Math.imul(mask ^ Math.imul(value, 0x9e3779b1), 0x85ebca77) >>> (32 - bits);
  const gone = new Uint8Array(values.length);
  for (let i = 0; i < n; i++) {
    const bit = 1 << i;
    const len = values.length;
    slots.fill(0);
    let upper = 0;
    for (let k = 0; k < len; k++) {
      if ((masks[k]! & values[k]! & bit) === 0) continue;
      let h = hash(masks[k]!, values[k]!);
      while (slots[h] !== 0) h = (h + 1) & slotMask;
      slots[h] = k + 1;
      upper++;
    }
    if (upper === 0) continue;
    gone.fill(0, 0, len);
    let merged = 0;
    for (let k = 0; k < len; k++) {
      const m = masks[k]!;
      if ((m & bit) === 0 || (values[k]! & bit) !== 0) continue;
      const v = (values[k]! | bit) >>> 0;
      for (let h = hash(m, v); slots[h] !== 0; h = (h + 1) & slotMask) {
        const j = slots[h]! - 1;
        if (masks[j] !== m || values[j] !== v) continue;
        gone[j] = 1;
        masks[k] = (m & ~bit) >>> 0;
        merged++;
        break;
      }
    }
    if (merged === 0) continue;
    let w = 0;
    for (let k = 0; k < len; k++) {
      if (gone[k] === 1) continue;
      values[w] = values[k]!;
      masks[w++] = masks[k]!;
    }
    values.length = w;
    masks.length = w;
  }
  return values.map((value, k) => ({ value, mask: masks[k]! }));
}
