/**
 * Prime implicants by the Quine–McCluskey method, multi-output.
 *
 * Every implicant carries a tag: the set of outputs (bit j = output j) in
 * whose ON ∪ DC it lies. Level k holds the implicants with k absent literals,
 * grouped by mask; two implicants merge only when their masks are equal and
 * their values differ in one bit, and the merged tag is the intersection of
 * the two tags. An implicant is a multi-output prime when no merge keeps its
 * whole tag: it is then a prime of the product of the outputs in its tag.
 * Don't-cares take part in merging; the cover step ignores them.
 */
import { fullMask } from "../logic";

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
 * is the intersection of its two halves along its lowest absent variable, and
 * a half whose tag equals the whole's is not prime. No maps and no merging
 * lists, so it is much faster for dense functions of few inputs.
 * `mintermTags[m]` is minterm m's tag; at most `maxPrimes` primes.
 */
export function denseTaggedPrimes(
  n: number,
  mintermTags: Uint32Array,
  limits: { maxPrimes: number; deadline: number },
): TaggedPrime[] {
  if (n > DENSE_MAX_INPUTS) throw new RangeError(`dense prime table: ${n} inputs, at most ${DENSE_MAX_INPUTS}`);
  if (n === 0) return mintermTags[0] ? [{ value: 0, mask: 0, tag: mintermTags[0] }] : [];
  const N = 3 ** n;
  const pow = new Int32Array(n + 1);
  pow[0] = 1;
  for (let i = 0; i < n; i++) pow[i + 1] = pow[i]! * 3;
  // The narrowest tags that hold every output: the table is what the loop waits on.
  let any = 0;
  for (let m = 0; m < mintermTags.length; m++) any |= mintermTags[m]!;
  any >>>= 0;
  const tag = any < 256 ? new Uint8Array(N) : any < 65536 ? new Uint16Array(N) : new Uint32Array(N);
  const notPrime = new Uint8Array(N);
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
