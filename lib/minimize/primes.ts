/**
 * Multi-output prime implicants, by three routes with the same result: from
 * compact cube covers by the recursive prime rule ({@link coverTaggedPrimes}),
 * by a dense table over all 3^n cubes ({@link denseTaggedPrimes}), and by the
 * Quine–McCluskey method ({@link taggedPrimes}), described here:
 *
 * Every implicant carries a tag: the set of outputs (bit j = output j) in
 * whose ON ∪ DC it lies. Level k holds the implicants with k absent literals,
 * grouped by mask; two implicants merge only when their masks are equal and
 * their values differ in one bit, and the merged tag is the intersection of
 * the two tags. An implicant is a multi-output prime when no merge keeps its
 * whole tag: it is then a prime of the product of the outputs in its tag.
 * Don't-cares take part in merging; the cover step ignores them.
 */
import type { Cube } from "../logic";
import { LOW_VARIABLE_WORDS, fullMask } from "../logic";
import { COST, type WorkBudget, mergeLists, primesOfCover, removeContained } from "./unate";

export interface TaggedPrime {
  value: number;
  mask: number;
  /** Outputs this term may serve (bit j = output j). */
  tag: number;
}

/** Thrown inside the exact route when the prime count or the implicant work exceeds its limit. */
export class ExactLimit extends Error {
  constructor(
    public readonly limit: "maxPrimes" | "implicants" | "timeLimitMs",
    public readonly count: number,
  ) {
    super(`exact route stopped by ${limit} at ${count}`);
  }
}

interface Group {
  values: number[];
  tags: number[];
  index: Map<number, number>;
}

function newGroup(): Group {
  return { values: [], tags: [], index: new Map() };
}

/**
 * All multi-output primes of the tagged minterm list. `tags[m]` is the tag of
 * minterm m (0 = in no output's ON ∪ DC). Limits: `maxPrimes` primes and
 * `maxImplicants` implicants generated in total.
 */
export function taggedPrimes(
  n: number,
  minterms: ArrayLike<number>,
  tagOf: (m: number) => number,
  limits: { maxPrimes: number; maxImplicants: number; deadline: number },
): TaggedPrime[] {
  const primes: TaggedPrime[] = [];
  let level = new Map<number, Group>();
  const g0 = newGroup();
  for (let i = 0; i < minterms.length; i++) {
    const m = minterms[i]!;
    const t = tagOf(m);
    if (t === 0) continue;
    g0.index.set(m, g0.values.length);
    g0.values.push(m);
    g0.tags.push(t);
  }
  level.set(fullMask(n), g0);
  let total = g0.values.length;
  let tick = 0;
  while (level.size > 0) {
    const next = new Map<number, Group>();
    for (const [mask, g] of level) {
      const len = g.values.length;
      const merged = new Uint8Array(len);
      for (let i = 0; i < len; i++) {
        const v = g.values[i]!;
        const t = g.tags[i]!;
        let bits = mask & ~v;
        while (bits !== 0) {
          const b = bits & -bits;
          bits ^= b;
          const k = g.index.get((v | b) >>> 0);
          if (k === undefined) continue;
          const t2 = g.tags[k]!;
          const mt = t & t2;
          if (mt === 0) continue;
          if (mt === t) merged[i] = 1;
          if (mt === t2) merged[k] = 1;
          const nm = (mask & ~b) >>> 0;
          let ng = next.get(nm);
          if (ng === undefined) {
            ng = newGroup();
            next.set(nm, ng);
          }
          if (!ng.index.has(v)) {
            ng.index.set(v, ng.values.length);
            ng.values.push(v);
            ng.tags.push(mt);
            if (++total > limits.maxImplicants) throw new ExactLimit("implicants", total);
          }
        }
        if ((++tick & 4095) === 0 && Date.now() > limits.deadline) throw new ExactLimit("timeLimitMs", total);
      }
      for (let i = 0; i < len; i++) {
        if (merged[i] === 0) {
          primes.push({ value: g.values[i]!, mask, tag: g.tags[i]! });
          if (primes.length > limits.maxPrimes) throw new ExactLimit("maxPrimes", primes.length);
        }
      }
    }
    level = next;
  }
  return primes;
}

/** Inputs up to which {@link denseTaggedPrimes} is used: 3^13 cubes, about 8 MB of tables. */
export const DENSE_MAX_INPUTS = 13;

/**
 * The same multi-output primes as {@link taggedPrimes}, from a table over all
 * 3^n cubes in ternary order (digit 0 / 1 a literal, 2 absent): a cube's tag
 * (the outputs it may serve) is the intersection of its two halves along any
 * absent variable, and a half whose tag equals the whole's is not prime. No
 * maps and no merging lists, so it is much faster for dense functions of few
 * inputs. The primes come in ternary order.
 * `mintermTags[m]` is minterm m's tag; at most `maxPrimes` primes.
 */
export function denseTaggedPrimes(
  n: number,
  mintermTags: Uint32Array,
  limits: { maxPrimes: number; deadline: number },
): TaggedPrime[] {
  if (n > DENSE_MAX_INPUTS) throw new RangeError(`dense prime table: ${n} inputs, at most ${DENSE_MAX_INPUTS}`);
  if (n === 0) return mintermTags[0] ? [{ value: 0, mask: 0, tag: mintermTags[0] }] : [];
  // Two ways over the same table, with the same primes in the same order. Visiting only the implicants
  // pays when they are few: at up to 55 % of the minterms in some output's ON or DC set it took half the
  // time of the scan at 10 to 13 inputs and 50 %, about the same at 60 %, and up to 2.5 times longer above.
  let care = 0;
  for (let m = 0; m < mintermTags.length; m++) if (mintermTags[m] !== 0) care++;
  return care <= 0.55 * mintermTags.length ? queueTaggedPrimes(n, mintermTags, limits) : scanTaggedPrimes(n, mintermTags, limits);
}

/**
 * The empty table both ways fill: 3^n cubes, the powers of 3, a tag per cube in the narrowest array that
 * holds every output (the table is what the loops wait on), and a not-prime mark per cube.
 */
function ternaryTable(n: number, mintermTags: Uint32Array) {
  const N = 3 ** n;
  const pow = new Int32Array(n + 1);
  pow[0] = 1;
  for (let i = 0; i < n; i++) pow[i + 1] = pow[i]! * 3;
  let any = 0;
  for (let m = 0; m < mintermTags.length; m++) any |= mintermTags[m]!;
  any >>>= 0;
  const tag = any < 256 ? new Uint8Array(N) : any < 65536 ? new Uint16Array(N) : new Uint32Array(N);
  return { N, pow, tag, notPrime: new Uint8Array(N) };
}

/** The worklist: only the implicants, level by level, each cube's partners found in the table. */
function queueTaggedPrimes(n: number, mintermTags: Uint32Array, limits: { maxPrimes: number; deadline: number }): TaggedPrime[] {
  const { N, pow, tag, notPrime } = ternaryTable(n, mintermTags);
  // The implicants found, level by level (a queue: every cube of k absent variables comes before every cube of
  // k + 1), each with its ternary index, its literal values and its absent variables. Only implicants are
  // visited, not all 3^n cubes: a table lookup finds a cube's partner along each variable.
  let cap = 1024;
  let qT = new Int32Array(cap);
  let qV = new Int32Array(cap);
  let qF = new Int32Array(cap);
  let tail = 0;
  const push = (T: number, v: number, f: number) => {
    if (tail === cap) {
      cap *= 2;
      const grow = (a: Int32Array) => {
        const b = new Int32Array(cap);
        b.set(a);
        return b;
      };
      qT = grow(qT);
      qV = grow(qV);
      qF = grow(qF);
    }
    qT[tail] = T;
    qV[tail] = v;
    qF[tail++] = f;
  };
  for (let m = 0; m < mintermTags.length; m++) {
    const t = mintermTags[m]!;
    if (t === 0) continue;
    let T = 0;
    for (let x = m; x !== 0; x &= x - 1) T += pow[31 - Math.clz32(x & -x)]!;
    tag[T] = t;
    push(T, m, 0);
  }
  // A cube and its partner along a variable it holds at 0 make the cube without that variable; its tag is the
  // intersection of theirs (the outputs both may serve), and a half whose tag equals the whole's is not prime.
  for (let head = 0; head < tail; head++) {
    if ((head & 4095) === 4095 && Date.now() > limits.deadline) throw new ExactLimit("timeLimitMs", head);
    const T = qT[head]!;
    const t = tag[T]!;
    const v = qV[head]!;
    const f = qF[head]!;
    for (let zeros = ~(v | f) & ((1 << n) - 1); zeros !== 0; zeros &= zeros - 1) {
      const i = 31 - Math.clz32(zeros & -zeros);
      const P = T + pow[i]!;
      const t2 = tag[P]!;
      if (t2 === 0) continue;
      const mt = t & t2;
      if (mt === 0) continue;
      if (mt === t) notPrime[T] = 1;
      if (mt === t2) notPrime[P] = 1;
      const W = P + pow[i]!;
      if (tag[W] === 0) {
        tag[W] = mt;
        push(W, v, f | (1 << i));
      }
    }
  }
  // The primes in ternary order, the order of a scan over the table: sorted by T · 3^n + their place in
  // the queue (both below 3^n, so the keys stay below 3^(2n) < 2^53 and are exact), a numeric sort
  // without a comparator.
  let count = 0;
  for (let k = 0; k < tail; k++) if (notPrime[qT[k]!] === 0) count++;
  if (count > limits.maxPrimes) throw new ExactLimit("maxPrimes", limits.maxPrimes + 1);
  const keys = new Float64Array(count);
  for (let k = 0, at = 0; k < tail; k++) if (notPrime[qT[k]!] === 0) keys[at++] = qT[k]! * N + k;
  keys.sort();
  const full = fullMask(n);
  const primes: TaggedPrime[] = new Array(count);
  for (let i = 0; i < count; i++) {
    const k = keys[i]! % N;
    primes[i] = { value: qV[k]! >>> 0, mask: (full & ~qF[k]!) >>> 0, tag: tag[qT[k]!]! };
  }
  return primes;
}

/** The table scan: every cube in ternary order, its tag from its two halves along its lowest absent variable. */
function scanTaggedPrimes(n: number, mintermTags: Uint32Array, limits: { maxPrimes: number; deadline: number }): TaggedPrime[] {
  const { N, pow, tag, notPrime } = ternaryTable(n, mintermTags);
  // Odometer over digits 1 .. n-1; digit 0 is unrolled (T, T + 1, T + 2 = the 0, 1 and absent cases).
  const digit = new Uint8Array(n + 1);
  let value = 0;
  let free = 0;
  // Halves of cube T along each absent variable of `f` (digit 0 excluded) that keep the tag t are not prime.
  const markHalves = (T: number, f: number, t: number) => {
    for (; f !== 0; f &= f - 1) {
      const j = 31 - Math.clz32(f & -f);
      const h1 = T - pow[j]!;
      const h0 = h1 - pow[j]!;
      if (tag[h0] === t) notPrime[h0] = 1;
      if (tag[h1] === t) notPrime[h1] = 1;
    }
  };
  for (let T = 0; T < N; T += 3) {
    let t0: number;
    let t1: number;
    if (free === 0) {
      t0 = mintermTags[value]!;
      t1 = mintermTags[value | 1]!;
    } else {
      const low = 31 - Math.clz32(free & -free);
      const p = pow[low]!;
      t0 = tag[T - 2 * p]! & tag[T - p]!;
      t1 = tag[T + 1 - 2 * p]! & tag[T + 1 - p]!;
      if (t0 !== 0) markHalves(T, free, t0);
      if (t1 !== 0) markHalves(T + 1, free, t1);
    }
    tag[T] = t0;
    tag[T + 1] = t1;
    const t2 = t0 & t1;
    tag[T + 2] = t2;
    if (t2 !== 0) {
      if (t0 === t2) notPrime[T] = 1;
      if (t1 === t2) notPrime[T + 1] = 1;
      if (free !== 0) markHalves(T + 2, free, t2);
    }
    if ((T & 0xffff) < 3 && T > 0 && Date.now() > limits.deadline) throw new ExactLimit("timeLimitMs", T);
    let i = 1;
    while (digit[i] === 2) {
      digit[i] = 0;
      free &= ~(1 << i);
      i++;
    }
    if (i < n) {
      if (++digit[i]! === 1) value |= 1 << i;
      else {
        value &= ~(1 << i);
        free |= 1 << i;
      }
    }
  }
  const full = fullMask(n);
  const primes: TaggedPrime[] = [];
  digit.fill(0);
  value = 0;
  free = 0;
  for (let T = 0; T < N; T += 3) {
    for (let d = 0; d < 3; d++) {
      const t = tag[T + d]!;
      if (t === 0 || notPrime[T + d] === 1) continue;
      const v = d === 1 ? value | 1 : value;
      const f = d === 2 ? free | 1 : free;
      primes.push({ value: v >>> 0, mask: (full & ~f) >>> 0, tag: t });
      if (primes.length > limits.maxPrimes) throw new ExactLimit("maxPrimes", primes.length);
    }
    let i = 1;
    while (digit[i] === 2) {
      digit[i] = 0;
      free &= ~(1 << i);
      i++;
    }
    if (i < n) {
      if (++digit[i]! === 1) value |= 1 << i;
      else {
        value &= ~(1 << i);
        free |= 1 << i;
      }
    }
  }
  return primes;
}

/**
 * A small disjoint cube cover of a truth table (bit m = minterm m). Splits on
 * the highest variable first: a constant block becomes a cube, a block whose
 * two halves are equal drops that variable; the blocks are then merged along
 * every variable. Each block is charged its cost (COST.merge a variable) to
 * `budget`.
 */
export function compactCover(t: Uint32Array, n: number, budget?: WorkBudget): Cube[] {
  if (n === 0) return (t[0]! & 1) === 1 ? [{ value: 0, mask: 0 }] : [];
  const full = fullMask(n);
  const values: number[] = [];
  const masks: number[] = [];
  // Minterms lo .. lo + 2^k - 1 (lo a multiple of 2^k): 0 all off, 1 all on, 2 mixed.
  const rangeState = (lo: number, k: number): 0 | 1 | 2 => {
    if (k >= 5) {
      let ones = false;
      let zeros = false;
      for (let w = lo >>> 5, end = (lo + (1 << k)) >>> 5; w < end; w++) {
        const x = t[w]!;
        if (x !== 0) ones = true;
        if (x !== 0xffffffff) zeros = true;
        if (ones && zeros) return 2;
      }
      return ones ? 1 : 0;
    }
    const all = (1 << (1 << k)) - 1;
    const bits = (t[lo >>> 5]! >>> (lo & 31)) & all;
    return bits === 0 ? 0 : bits === all ? 1 : 2;
  };
  // Whether the block's halves along variable k - 1 are equal (k ≥ 1).
  const sameHalves = (lo: number, k: number): boolean => {
    const h = 1 << (k - 1);
    if (k - 1 >= 5) {
      for (let w = lo >>> 5, u = (lo + h) >>> 5, end = u; w < end; w++, u++) if (t[w] !== t[u]) return false;
      return true;
    }
    const bits = t[lo >>> 5]! >>> (lo & 31);
    const low = (1 << h) - 1;
    return (bits & low) === ((bits >>> h) & low);
  };
  // `free`: variables at or above k that the block does not depend on.
  const walk = (lo: number, k: number, free: number) => {
    const st = rangeState(lo, k);
    if (st === 0) return;
    if (st === 1) {
      budget?.spend(n * COST.merge);
      values.push((lo & ~free) >>> 0);
      masks.push((full & ~((1 << k) - 1) & ~free) >>> 0);
      return;
    }
    if (sameHalves(lo, k)) {
      walk(lo, k - 1, free | (1 << (k - 1)));
      return;
    }
    walk(lo, k - 1, free);
    walk(lo + (1 << (k - 1)), k - 1, free);
  };
  walk(0, n, 0);
  return mergeLists(values, masks, n);
}

/**
 * The cover F of the function of truth table t with the literals its function
 * does not need dropped: where the function is positive unate in a variable
 * (never 1 with it 0 and 0 with it 1), a cube's complemented literal of it
 * goes, and likewise for negative unate. Each cube stays an implicant, so the
 * list still covers the function, and the recursive rule then splits only on
 * the binate variables (a unate function's primes are its maximal cubes).
 */
function dropUnateLiterals(F: readonly Cube[], t: Uint32Array, n: number): Cube[] {
  // Literals that may go: drop0 = complemented ones, drop1 = plain ones (bit i = variable i).
  let drop0 = 0;
  let drop1 = 0;
  for (let i = 0; i < n; i++) {
    let up = 0; // points that are 1 with x_i = 0 and 0 with x_i = 1
    let down = 0; // points that are 1 with x_i = 1 and 0 with x_i = 0
    if (i < 5) {
      const sh = 1 << i;
      // The positions with variable i at 0 (within the table's 2^n points when n < 5).
      const L = n >= 5 ? ~LOW_VARIABLE_WORDS[i]! : ~LOW_VARIABLE_WORDS[i]! & (2 ** 2 ** n - 1);
      for (let w = 0; w < t.length; w++) {
        const x0 = t[w]! & L;
        const x1 = (t[w]! >>> sh) & L;
        up |= x0 & ~x1;
        down |= x1 & ~x0;
      }
    } else {
      const s = 1 << (i - 5);
      for (let w = 0; w < t.length; w++) {
        if (w & s) continue;
        up |= t[w]! & ~t[w + s]!;
        down |= t[w + s]! & ~t[w]!;
      }
    }
    if (up === 0) drop0 |= 1 << i;
    if (down === 0) drop1 |= 1 << i;
  }
  if ((drop0 | drop1) === 0) return F.slice();
  const out: Cube[] = [];
  for (const c of F) {
    const mask = (c.mask & ~((drop0 & ~c.value) | (drop1 & c.value))) >>> 0;
    out.push({ value: (c.value & mask) >>> 0, mask });
  }
  return out;
}

/** The maximal cubes among the nonempty intersections p ∩ q, p ∈ P, q ∈ Q (cubes over n ≤ 20 inputs). */
function meet(n: number, P: readonly Cube[], Q: readonly Cube[], budget?: WorkBudget): Cube[] {
  budget?.spend(P.length * Q.length * COST.pair);
  const scale = 2 ** n;
  const seen = new Set<number>();
  const products: Cube[] = [];
  for (const p of P) {
    for (const q of Q) {
      if (((p.value ^ q.value) & p.mask & q.mask) !== 0) continue;
      const c = { value: (p.value | q.value) >>> 0, mask: (p.mask | q.mask) >>> 0 };
      const key = c.mask * scale + c.value;
      if (seen.has(key)) continue;
      seen.add(key);
      products.push(c);
    }
  }
  budget?.spend(products.length * COST.product);
  return removeContained(products, budget);
}

/**
 * The same multi-output primes as {@link taggedPrimes}, from cube covers of
 * each output's ON ∪ DC (`care[j]`, a truth table), with work proportional
 * to the covers and the primes rather than to the implicants or to 3^n. The
 * primes of each output come from the recursive rule ({@link primesOfCover})
 * on its {@link compactCover}, without the literals its function does not
 * need ({@link dropUnateLiterals}); those of the product f_T of a set T of outputs
 * are the maximal intersections of a prime of f_{T∖j} with a prime of f_j (a
 * prime of a product is the intersection of primes of its factors). Every
 * set T with f_T ≠ 0 is visited, by adding outputs in index order and
 * stopping at an empty product; the tables of the products tell an empty one
 * and one equal to f_{T∖j} (same primes) without intersecting cubes. A prime
 * of f_T that fits output j is a prime of f_{T∪j} too, so the union of the
 * sets in whose primes a cube appears is its tag (all the outputs it fits):
 * exactly the multi-output primes. Sorted in the ternary order of
 * {@link denseTaggedPrimes}. Throws ExactLimit past `maxPrimes` primes (or,
 * without a work budget, intermediate sets of 4·maxPrimes cubes) or the
 * deadline, and OverBudget (./unate) when `work` runs out. `covers`: the
 * compact covers of `care`, when the caller has them.
 */
export function coverTaggedPrimes(
  n: number,
  care: readonly Uint32Array[],
  limits: { maxPrimes: number; deadline: number },
  options: { covers?: readonly (readonly Cube[])[]; work?: WorkBudget } = {},
): TaggedPrime[] {
  const k = care.length;
  if (k > 31) throw new RangeError(`${k} outputs: tags hold at most 31`);
  const full = fullMask(n);
  const words = care[0]?.length ?? 0;
  const work = options.work;
  const covers = options.covers ?? care.map((t) => compactCover(t, n));
  // Without a budget, intermediate sets are held to a few times maxPrimes; with one, the budget holds them.
  const cap = work ? Infinity : limits.maxPrimes * 4;
  let single: Cube[][];
  try {
    single = covers.map((F, j) => primesOfCover(dropUnateLiterals(F, care[j]!, n), full, cap, work));
  } catch (e) {
    if (e instanceof RangeError) throw new ExactLimit("maxPrimes", limits.maxPrimes);
    throw e;
  }
  // Keys mask·2^n + value: small integers (the fast map keys) up to 15 inputs, exact beyond.
  const scale = 2 ** n;
  const keyOf = (c: Cube): number => c.mask * scale + c.value;
  const tags = new Map<number, number>();
  const cubes: Cube[] = [];
  // P: the primes of f_T, `table` its truth table, `last` the highest output in T.
  const extend = (T: number, P: Cube[], table: Uint32Array, last: number) => {
    for (const p of P) {
      const key = keyOf(p);
      const t = tags.get(key);
      if (t !== undefined) {
        tags.set(key, t | T);
        continue;
      }
      tags.set(key, T);
      cubes.push(p);
      if (cubes.length > limits.maxPrimes) throw new ExactLimit("maxPrimes", cubes.length);
    }
    if (Date.now() > limits.deadline) throw new ExactLimit("timeLimitMs", cubes.length);
    for (let j = last + 1; j < k; j++) {
      work?.spend(words);
      const cj = care[j]!;
      const next = new Uint32Array(words);
      let any = 0;
      let same = true;
      for (let w = 0; w < words; w++) {
        const x = table[w]! & cj[w]!;
        next[w] = x;
        any |= x;
        if (x !== table[w]) same = false;
      }
      if (any === 0) continue;
      extend((T | (1 << j)) >>> 0, same ? P : meet(n, P, single[j]!, work), next, j);
    }
  };
  for (let j = 0; j < k; j++) if (single[j]!.length > 0) extend(1 << j, single[j]!, care[j]!, j);
  // Ternary index: digit i is 0 or 1 for a literal of variable i, 2 when it is absent.
  const pow = [1];
  for (let i = 1; i < n; i++) pow.push(pow[i - 1]! * 3);
  const index = cubes.map((c) => {
    let x = 0;
    for (let i = 0; i < n; i++) x += ((c.mask >>> i) & 1 ? (c.value >>> i) & 1 : 2) * pow[i]!;
    return x;
  });
  const order = cubes.map((_, i) => i).sort((a, b) => index[a]! - index[b]!);
  return order.map((i) => {
    const c = cubes[i]!;
    return { value: c.value, mask: c.mask, tag: tags.get(keyOf(c))! };
  });
}
