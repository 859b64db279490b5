/** The order in which a cover's terms are listed. */
import type { Cube } from "../logic";
import { fullMask, popcount } from "../logic";

export function literalsOf(cubes: readonly Cube[]): number {
  let total = 0;
  for (let i = 0; i < cubes.length; i++) total += popcount(cubes[i]!.mask);
  return total;
}

/**
 * A cover's terms in canonical order: fewer literals first, then the larger
 * mask, then the larger value (earliest declared inputs first, plain before
 * complemented); ties keep their order. With `invert`, POS sum terms: every
 * literal inverted. Up to 27 inputs the keys fit two 32-bit words, sorted by
 * a stable radix sort (a comparison sort of tens of thousands of terms is
 * the slow part otherwise).
 */
export function canonicalOrder(cv: readonly Cube[], n: number, invert: boolean): Cube[] {
  const len = cv.length;
  const out: Cube[] = new Array<Cube>(len);
  for (let i = 0; i < len; i++) {
    const c = cv[i]!;
    out[i] = invert ? { value: (~c.value & c.mask) >>> 0, mask: c.mask } : c;
  }
  if (n > 27) {
    return out.sort((a, b) => popcount(a.mask) - popcount(b.mask) || b.mask - a.mask || b.value - a.value);
  }
  const full = fullMask(n);
  const scale = 2 ** n;
  // Ascending (hi, lo) with hi = literals · 2^n + (full - mask), lo = full - value.
  const hi = new Uint32Array(len);
  const lo = new Uint32Array(len);
  for (let i = 0; i < len; i++) {
    const c = out[i]!;
    hi[i] = popcount(c.mask) * scale + (full - c.mask);
    lo[i] = full - c.value;
  }
  // Terms often arrive in one run (the cover search lists them by row): then a scan orders them.
  let rising = true;
  let falling = true;
  for (let i = 1; i < len && (rising || falling); i++) {
    const d = hi[i]! - hi[i - 1]! || lo[i]! - lo[i - 1]!;
    if (d < 0) rising = false;
    if (d >= 0) falling = false;
  }
  if (rising) return out;
  if (falling) return out.reverse();
  let perm = new Int32Array(len);
  for (let i = 0; i < len; i++) perm[i] = i;
  let next = new Int32Array(len);
  const count = new Int32Array(257);
  // Least significant byte first: the bytes of lo, then those of hi.
  const loPasses = Math.ceil(n / 8);
  const passes = loPasses + Math.ceil((n + 5) / 8);
  for (let pass = 0; pass < passes; pass++) {
    const keys = pass < loPasses ? lo : hi;
    const shift = 8 * (pass < loPasses ? pass : pass - loPasses);
    count.fill(0);
    for (let i = 0; i < len; i++) count[((keys[i]! >>> shift) & 255) + 1]!++;
    // One byte value throughout: the pass would move nothing.
    if (len === 0 || count[((keys[0]! >>> shift) & 255) + 1] === len) continue;
    for (let d = 0; d < 256; d++) count[d + 1]! += count[d]!;
    for (let i = 0; i < len; i++) {
      const p = perm[i]!;
      next[count[(keys[p]! >>> shift) & 255]!++] = p;
    }
    const t = perm;
    perm = next;
    next = t;
  }
  const sorted: Cube[] = new Array<Cube>(len);
  for (let i = 0; i < len; i++) sorted[i] = out[perm[i]!]!;
  return sorted;
}
