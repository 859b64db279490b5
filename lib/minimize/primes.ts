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
