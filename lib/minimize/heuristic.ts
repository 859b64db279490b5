/**
 * The expand / irredundant / reduce loop for one output (after Brayton et
 * al., 1984). EXPAND raises literals of each term while it stays off the
 * OFF-set, preferring raises that reach uncovered ON points; IRREDUNDANT
 * drops terms the others cover; REDUCE shrinks each term to the smallest cube
 * holding the points only it covers, so that the next EXPAND can move it. The
 * loop ends when a pass no longer lowers (products, literals). The result is
 * prime (it ends on EXPAND) and irredundant (IRREDUNDANT after it).
 *
 * Up to TRUTH_TABLE_MAX_INPUTS inputs the set queries run on a truth table
 * with per-minterm cover counts; above, on cube lists with unate-recursive
 * complementation and tautology.
 */
import type { Cube } from "../logic";
import { TRUTH_TABLE_MAX_INPUTS, fullMask, popcount, tableFromCubes } from "../logic";
import { cofactorCube, complement, removeContained, tautology } from "./unate";

/** The set queries the loop needs. */
interface Space {
  hitsOff(c: Cube): boolean;
  /** Starts tracking the cover F (replacing any previous one). */
  track(F: Cube[]): void;
  add(c: Cube): void;
  remove(c: Cube): void;
  /** Points of c that the tracked cover must still reach (a score; larger is better). */
  uncovered(c: Cube): number;
  /** c (tracked) is covered by the other tracked terms and the DC-set. */
  redundant(c: Cube): boolean;
  /** Smallest cube holding the ON points of c (tracked) that no other term covers; null if none. */
  essentialPart(c: Cube): Cube | null;
}

function forEachMinterm(c: Cube, full: number, f: (m: number) => boolean | void): void {
  const free = (full & ~c.mask) >>> 0;
  let sub = 0;
  for (;;) {
    if (f((c.value | sub) >>> 0) === false) return;
    if (sub === free) return;
    sub = ((sub - free) & free) >>> 0;
  }
}

class TableSpace implements Space {
  private readonly full: number;
  private readonly on: Uint32Array;
  private readonly care: Uint32Array;
  private readonly count: Int32Array;
  /** A point in both ON and DC tables counts as ON (it must be covered). */
  constructor(n: number, on: Uint32Array, dc: Uint32Array) {
    this.full = fullMask(n);
    this.on = on;
    this.care = new Uint32Array(on.length);
    for (let k = 0; k < on.length; k++) this.care[k] = on[k]! | dc[k]!;
    this.count = new Int32Array(2 ** n);
  }
  private isOn(m: number): boolean {
    return ((this.on[m >>> 5]! >>> (m & 31)) & 1) === 1;
  }
  hitsOff(c: Cube): boolean {
    let hit = false;
    forEachMinterm(c, this.full, (m) => {
      if (((this.care[m >>> 5]! >>> (m & 31)) & 1) === 0) {
        hit = true;
        return false;
      }
    });
    return hit;
  }
  track(F: Cube[]): void {
    this.count.fill(0);
    for (const c of F) this.add(c);
  }
  add(c: Cube): void {
    forEachMinterm(c, this.full, (m) => void this.count[m]!++);
  }
  remove(c: Cube): void {
    forEachMinterm(c, this.full, (m) => void this.count[m]!--);
  }
  uncovered(c: Cube): number {
    let k = 0;
    forEachMinterm(c, this.full, (m) => {
      if (this.count[m] === 0 && this.isOn(m)) k++;
    });
    return k;
  }
  redundant(c: Cube): boolean {
    let red = true;
    forEachMinterm(c, this.full, (m) => {
      if (this.count[m]! < 2 && this.isOn(m)) {
        red = false;
        return false;
      }
    });
    return red;
  }
  essentialPart(c: Cube): Cube | null {
    let and = 0xffffffff;
    let or = 0;
    let any = false;
    forEachMinterm(c, this.full, (m) => {
      if (this.count[m] === 1 && this.isOn(m)) {
        any = true;
        and &= m;
        or |= m;
      }
    });
    if (!any) return null;
    const mask = (this.full & ~(and ^ or)) >>> 0;
    return { value: (and & mask) >>> 0, mask };
  }
}

class CubeSpace implements Space {
  private readonly full: number;
  private readonly off: Cube[];
  private readonly dc: Cube[];
  private readonly onCubes: Cube[];
  private F: Cube[] = [];
  constructor(n: number, on: Cube[], dc: Cube[]) {
    this.full = fullMask(n);
    this.off = complement(on.concat(dc), this.full);
    // Points in both sets count as ON: the DC cubes used for redundancy are trimmed to DC \ ON.
    const notOn = complement(on, this.full);
    const trimmed: Cube[] = [];
    for (const d of dc) {
      for (const q of notOn) {
        if (((d.value ^ q.value) & d.mask & q.mask) !== 0) continue;
        trimmed.push({ value: (d.value | q.value) >>> 0, mask: (d.mask | q.mask) >>> 0 });
      }
    }
    this.dc = removeContained(trimmed);
    this.onCubes = on;
  }
  hitsOff(c: Cube): boolean {
    for (const r of this.off) if (((r.value ^ c.value) & r.mask & c.mask) === 0) return true;
    return false;
  }
  track(F: Cube[]): void {
    this.F = F.slice();
  }
  add(c: Cube): void {
    this.F.push(c);
  }
  remove(c: Cube): void {
    const i = this.F.findIndex((d) => d.value === c.value && d.mask === c.mask);
    if (i >= 0) this.F.splice(i, 1);
  }
  uncovered(c: Cube): number {
    // Count specified ON terms met by c that no tracked term contains.
    let k = 0;
    for (const o of this.onCubes) {
      if (((o.value ^ c.value) & o.mask & c.mask) !== 0) continue;
      if (!this.F.some((d) => (d.mask & ~o.mask) === 0 && ((d.value ^ o.value) & d.mask) === 0)) k++;
    }
    return k;
  }
  private others(c: Cube): Cube[] {
    const i = this.F.findIndex((d) => d.value === c.value && d.mask === c.mask);
    const rest = this.F.slice();
    if (i >= 0) rest.splice(i, 1);
    return rest.concat(this.dc);
  }
  redundant(c: Cube): boolean {
    return tautology(cofactorCube(this.others(c), c), (this.full & ~c.mask) >>> 0);
  }
  essentialPart(c: Cube): Cube | null {
    const space = (this.full & ~c.mask) >>> 0;
    const missing = complement(cofactorCube(this.others(c), c), space);
    if (missing.length === 0) return null;
    // Free bits in some missing cube, or bits where the cubes disagree, stay free.
    let freeBits = 0;
    for (const q of missing) freeBits |= space & ~q.mask;
    let ones = 0xffffffff;
    let zeros = 0xffffffff;
    for (const q of missing) {
      ones &= q.value;
      zeros &= ~q.value;
    }
    const fixed = (space & ~freeBits & (ones | zeros)) >>> 0;
    return { value: ((c.value & c.mask) | (ones & fixed)) >>> 0, mask: (c.mask | fixed) >>> 0 };
  }
}

/** The first pass could not finish before the deadline. */
export class HeuristicTimeout extends Error {}

function costOf(F: readonly Cube[]): number {
  let lits = 0;
  for (const c of F) lits += popcount(c.mask);
  return F.length * 4096 + lits;
}

function expandCube(space: Space, c: Cube): Cube {
  let cur = c;
  for (;;) {
    let bestBit = 0;
    let bestScore = -1;
    let bits = cur.mask;
    while (bits !== 0) {
      const b = bits & -bits;
      bits ^= b;
      const mirror = { value: (cur.value ^ b) >>> 0, mask: cur.mask };
      if (space.hitsOff(mirror)) continue;
      const s = space.uncovered(mirror);
      if (s > bestScore) {
        bestScore = s;
        bestBit = b;
      }
    }
    if (bestScore < 0) return cur;
    cur = { value: (cur.value & ~bestBit) >>> 0, mask: (cur.mask & ~bestBit) >>> 0 };
  }
}

function expand(space: Space, F: Cube[], deadline: number): Cube[] {
  const order = F.slice().sort((a, b) => popcount(a.mask) - popcount(b.mask));
  space.track([]);
  const out: Cube[] = [];
  let tick = 0;
  for (const c of order) {
    if ((++tick & 255) === 0 && Date.now() > deadline) throw new HeuristicTimeout();
    if (space.uncovered(c) === 0 && out.length > 0) continue;
    const e = expandCube(space, c);
    out.push(e);
    space.add(e);
  }
  return removeContained(out);
}

function irredundant(space: Space, F: Cube[]): Cube[] {
  space.track(F);
  // Smaller terms are tried for removal first: they are the cheapest to lose.
  const order = F.slice().sort((a, b) => popcount(b.mask) - popcount(a.mask));
  const keep: Cube[] = [];
  for (const c of order) {
    if (space.redundant(c)) space.remove(c);
    else keep.push(c);
  }
  return keep;
}

function reduce(space: Space, F: Cube[]): Cube[] {
  space.track(F);
  const order = F.slice().sort((a, b) => popcount(a.mask) - popcount(b.mask));
  const out: Cube[] = [];
  for (const c of order) {
    const r = space.essentialPart(c);
    space.remove(c);
    if (r !== null) {
      space.add(r);
      out.push(r);
    }
  }
  return out;
}

/**
 * A prime and irredundant cover of one output: ON ⊆ cover ⊆ ON ∪ DC.
 * `deadline` (epoch ms) stops the improvement loop early; the last prime and
 * irredundant cover is returned.
 */
export function heuristicCover(
  n: number,
  on: Cube[],
  dc: Cube[],
  deadline: number,
  tables?: { on: Uint32Array; dc: Uint32Array },
): Cube[] {
  if (on.length === 0) return [];
  const space: Space =
    n <= TRUTH_TABLE_MAX_INPUTS
      ? new TableSpace(n, tables?.on ?? tableFromCubes(on, n), tables?.dc ?? tableFromCubes(dc, n))
      : new CubeSpace(n, on, dc);
  let F = irredundant(space, expand(space, on, deadline));
  let cost = costOf(F);
  for (let pass = 0; pass < 20 && Date.now() < deadline; pass++) {
    let G: Cube[];
    try {
      G = irredundant(space, expand(space, reduce(space, F), deadline));
    } catch (e) {
      if (e instanceof HeuristicTimeout) break;
      throw e;
    }
    const g = costOf(G);
    if (g >= cost) break;
    F = G;
    cost = g;
  }
  return F;
}
