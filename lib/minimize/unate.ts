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

/** Complement of the union of F within the variables of `space`. */
export function complement(F: readonly Cube[], space: number): Cube[] {
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
  const c1 = complement(cofactorLiteral(F, bit, true), rest);
  const c0 = complement(cofactorLiteral(F, bit, false), rest);
  // A cube in both halves needs no literal of the split variable.
  const key = (c: Cube) => c.mask * 1073741824 + c.value;
  const in0 = new Set(c0.map(key));
  const both = new Set<number>();
  const out: Cube[] = [];
  for (const c of c1) {
    if (in0.has(key(c))) {
      both.add(key(c));
      out.push(c);
    } else out.push({ value: (c.value | bit) >>> 0, mask: (c.mask | bit) >>> 0 });
  }
  for (const c of c0) if (!both.has(key(c))) out.push({ value: c.value, mask: (c.mask | bit) >>> 0 });
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

/** Drops cubes contained in another cube of the list. */
export function removeContained(F: readonly Cube[]): Cube[] {
  const sorted = F.slice().sort((a, b) => popcount(a.mask) - popcount(b.mask));
  const out: Cube[] = [];
  for (const c of sorted) {
    let inside = false;
    for (const d of out) {
      if ((d.mask & ~c.mask) === 0 && ((d.value ^ c.value) & d.mask) === 0) {
        inside = true;
        break;
      }
    }
    if (!inside) out.push(c);
  }
  return out;
}

/**
 * All prime implicants of the function covered by F, by the recursive
 * (Shannon) rule P(f) = ABS(x·P(f_x) ∪ x'·P(f_x') ∪ P(f_x)·P(f_x')), where
 * ABS drops cubes contained in others; a unate cover's primes are its
 * maximal cubes. Throws RangeError when an intermediate set exceeds `cap`.
 */
export function primesOfCover(F: readonly Cube[], space: number, cap = Infinity): Cube[] {
  if (F.length === 0) return [];
  for (const c of F) if ((c.mask & space) === 0) return [{ value: 0, mask: 0 }];
  const { bit, binate } = splitBit(F, space);
  if (!binate) return removeContained(F);
  const rest = (space & ~bit) >>> 0;
  const P1 = primesOfCover(cofactorLiteral(F, bit, true), rest, cap);
  const P0 = primesOfCover(cofactorLiteral(F, bit, false), rest, cap);
  const cand: Cube[] = [];
  for (const p of P1) cand.push({ value: (p.value | bit) >>> 0, mask: (p.mask | bit) >>> 0 });
  for (const q of P0) cand.push({ value: q.value, mask: (q.mask | bit) >>> 0 });
  for (const p of P1) {
    for (const q of P0) {
      if (((p.value ^ q.value) & p.mask & q.mask) !== 0) continue;
      cand.push({ value: (p.value | q.value) >>> 0, mask: (p.mask | q.mask) >>> 0 });
    }
    if (cand.length > cap) throw new RangeError(`more than ${cap} candidate primes`);
  }
  return removeContained(dedupe(cand));
}

function dedupe(F: Cube[]): Cube[] {
  const seen = new Set<number>();
  const out: Cube[] = [];
  for (const c of F) {
    const k = c.mask * 1073741824 + c.value;
    if (seen.has(k)) continue;
    seen.add(k);
    out.push(c);
  }
  return out;
}

/**
 * Merges a disjoint cube list along each variable in turn (pairs equal but
 * for that variable become one cube). The union is unchanged; lists of
 * minterms of functions with large cubes shrink by orders of magnitude.
 */
export function mergeAlongVariables(F: readonly Cube[], n: number): Cube[] {
  let cur = new Map<number, Cube>();
  for (const c of F) cur.set(c.mask * 1073741824 + c.value, c);
  for (let i = 0; i < n; i++) {
    const bit = 1 << i;
    const next = new Map<number, Cube>();
    for (const [k, c] of cur) {
      if (!(c.mask & bit)) {
        next.set(k, c);
        continue;
      }
      if (c.value & bit) {
        if (!cur.has(c.mask * 1073741824 + ((c.value & ~bit) >>> 0))) next.set(k, c);
        continue;
      }
      const pk = c.mask * 1073741824 + ((c.value | bit) >>> 0);
      if (cur.has(pk)) {
        const m = { value: c.value, mask: (c.mask & ~bit) >>> 0 };
        next.set(m.mask * 1073741824 + m.value, m);
      } else next.set(k, c);
    }
    cur = next;
  }
  return [...cur.values()];
}
