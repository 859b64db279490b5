/**
 * Cube-list algebra for functions too wide for truth tables (more than
 * TRUTH_TABLE_MAX_INPUTS inputs), plus conversions between minterm ranges,
 * truth tables and cube lists. A cube list is a sum of products over n inputs
 * (bit layout as in lib/logic: first input = most significant bit).
 */
import { cubeCovers, cubeIntersect, fullMask, popcount, type Cube, type TruthTable } from "../logic/index";

/** Thrown when a cube list outgrows its limit; the caller turns it into a diagnostic. */
export class CubeLimitError extends Error {
  constructor(public readonly limit: number) {
    super(`more than ${limit} product terms`);
  }
}

/**
 * Removes duplicates and cubes contained in another cube of the list
 * (single-cube containment). Kept cubes are grouped by mask, so each check
 * costs one set lookup per distinct mask rather than one per cube.
 */
export function absorb(cubes: readonly Cube[]): Cube[] {
  if (cubes.length > FULL_ABSORB_MAX) return dedupe(cubes);
  const sorted = [...cubes].sort((a, b) => popcount(a.mask) - popcount(b.mask));
  const byMask = new Map<number, Set<number>>();
  const kept: Cube[] = [];
  for (const c of sorted) {
    let covered = false;
    for (const [mask, values] of byMask) {
      if ((mask & ~c.mask) === 0 && values.has((c.value & mask) >>> 0)) {
        covered = true;
        break;
      }
    }
    if (covered) continue;
    let values = byMask.get(c.mask);
    if (!values) {
      values = new Set();
      byMask.set(c.mask, values);
    }
    values.add(c.value);
    kept.push(c);
  }
  return kept;
}

/**
 * Longest list that absorb checks for containment; containment only keeps
 * lists short, so beyond this length (where the check costs more than it
 * saves) only exact duplicates are removed.
 */
export const FULL_ABSORB_MAX = 4000;

function dedupe(cubes: readonly Cube[]): Cube[] {
  const seen = new Set<string>();
  const out: Cube[] = [];
  for (const c of cubes) {
    const k = `${c.value},${c.mask}`;
    if (seen.has(k)) continue;
    seen.add(k);
    out.push(c);
  }
  return out;
}

function guard(cubes: Cube[], limit: number): Cube[] {
  if (cubes.length > limit) throw new CubeLimitError(limit);
  return cubes;
}

export function cubesOr(a: readonly Cube[], b: readonly Cube[], limit = Infinity): Cube[] {
  return guard(absorb([...a, ...b]), limit);
}

export function cubesAnd(a: readonly Cube[], b: readonly Cube[], limit = Infinity): Cube[] {
  const out: Cube[] = [];
  for (const x of a) {
    for (const y of b) {
      const c = cubeIntersect(x, y);
      if (c) out.push(c);
    }
    if (out.length > 4 * limit) guard(absorb(out), limit);
  }
  return guard(absorb(out), limit);
}

/** Cofactor of a cube list with respect to the input at bit `bit` set to `v`. */
function cofactor(f: readonly Cube[], bit: number, v: 0 | 1): Cube[] {
  const out: Cube[] = [];
  for (const c of f) {
    if (c.mask & bit) {
      if (((c.value & bit) !== 0 ? 1 : 0) !== v) continue;
      out.push({ value: (c.value & ~bit) >>> 0, mask: (c.mask & ~bit) >>> 0 });
    } else {
      out.push(c);
    }
  }
  return out;
}

/**
 * Complement of a cube list over n inputs, by Shannon expansion on the input
 * that appears in most cubes; a single cube is complemented by De Morgan into
 * disjoint cubes.
 */
export function cubesNot(f: readonly Cube[], n: number, limit = Infinity): Cube[] {
  return guard(absorb(complement(f, fullMask(n), limit)), limit);
}

function complement(f: readonly Cube[], space: number, limit: number): Cube[] {
  if (f.length === 0) return [{ value: 0, mask: 0 }];
  for (const c of f) if (c.mask === 0) return [];
  if (f.length === 1) {
    const c = f[0]!;
    const out: Cube[] = [];
    let prefixMask = 0;
    let m = c.mask;
    while (m !== 0) {
      const bit = (m & -m) >>> 0;
      m = (m & ~bit) >>> 0;
      // literal flipped at `bit`, earlier literals kept: disjoint pieces
      out.push({
        value: ((c.value & prefixMask) | (~c.value & bit)) >>> 0,
        mask: (prefixMask | bit) >>> 0,
      });
      prefixMask = (prefixMask | bit) >>> 0;
    }
    return out;
  }
  let best = 0;
  let bestCount = -1;
  for (let m = space; m !== 0; ) {
    const bit = (m & -m) >>> 0;
    m = (m & ~bit) >>> 0;
    let count = 0;
    for (const c of f) if (c.mask & bit) count++;
    if (count > bestCount) {
      bestCount = count;
      best = bit;
    }
  }
  const rest = (space & ~best) >>> 0;
  const c1 = complement(cofactor(f, best, 1), rest, limit);
  const c0 = complement(cofactor(f, best, 0), rest, limit);
  if (c1.length + c0.length > 2 * limit) throw new CubeLimitError(limit);
  // cubes present in both halves do not depend on the splitting input
  const key = (c: Cube) => `${c.value},${c.mask}`;
  const in0 = new Set(c0.map(key));
  const in1 = new Set(c1.map(key));
  const merged: Cube[] = [];
  const split: Cube[] = [];
  for (const c of c1) {
    if (in0.has(key(c))) merged.push(c);
    else split.push({ value: (c.value | best) >>> 0, mask: (c.mask | best) >>> 0 });
  }
  for (const c of c0) if (!in1.has(key(c))) split.push({ value: c.value, mask: (c.mask | best) >>> 0 });
  // each half is free of contained cubes already; only a merged cube can contain a split one
  if (merged.length === 0 || merged.length * split.length > 4_000_000) return [...merged, ...split];
  return [...merged, ...split.filter((c) => !merged.some((m) => cubeCovers(m, c)))];
}

export function cubesXor(a: readonly Cube[], b: readonly Cube[], n: number, limit = Infinity): Cube[] {
  const na = cubesNot(a, n, limit);
  const nb = cubesNot(b, n, limit);
  return cubesOr(cubesAnd(a, nb, limit), cubesAnd(na, b, limit), limit);
}

/**
 * The inclusive minterm range lo..hi over k bits as disjoint cubes whose
 * masks are bits 0..k-1 (aligned power-of-two blocks).
 */
export function rangeToCubes(lo: number, hi: number, k: number): Cube[] {
  const out: Cube[] = [];
  const all = fullMask(k);
  let m = lo;
  while (m <= hi) {
    let size = 1;
    while (size * 2 <= 2 ** k && m % (size * 2) === 0 && m + size * 2 - 1 <= hi) size *= 2;
    const free = size - 1;
    out.push({ value: m >>> 0, mask: (all & ~free) >>> 0 });
    m += size;
  }
  return out;
}

/**
 * A truth table over k local inputs (local input j is bit k-1-j of the
 * minterm) as disjoint cubes over n inputs, where local input j is design
 * input vars[j]. Halves that are all zero or all one end the recursion, so
 * the list is usually far shorter than the minterm list.
 */
export function tableToCubes(t: TruthTable, vars: readonly number[], n: number): Cube[] {
  const k = vars.length;
  const out: Cube[] = [];
  const rec = (lo: number, size: number, depth: number, value: number, mask: number) => {
    const s = segment(t, lo, size);
    if (s === 0) return;
    if (s === 1) {
      out.push({ value: value >>> 0, mask: mask >>> 0 });
      return;
    }
    const bit = 1 << (n - 1 - vars[depth]!);
    const half = size / 2;
    rec(lo, half, depth + 1, value, mask | bit);
    rec(lo + half, half, depth + 1, value | bit, mask | bit);
  };
  rec(0, 2 ** k, 0, 0, 0);
  return out;
}

/** 0 when the minterms lo..lo+size-1 are all false, 1 when all true, 2 when mixed. */
function segment(t: TruthTable, lo: number, size: number): 0 | 1 | 2 {
  if (size >= 32) {
    const w0 = lo >>> 5;
    const w1 = w0 + size / 32;
    const first = t[w0]!;
    if (first !== 0 && first !== 0xffffffff) return 2;
    for (let w = w0 + 1; w < w1; w++) if (t[w] !== first) return 2;
    return first === 0 ? 0 : 1;
  }
  const all = size === 32 ? 0xffffffff : (1 << size) - 1;
  const bits = (t[lo >>> 5]! >>> (lo & 31)) & all;
  return bits === 0 ? 0 : bits === all ? 1 : 2;
}
