/**
 * Lower bounds for covers found without the exact search. Two ON points
 * (of outputs j and k) are independent when the smallest cube holding both
 * meets the OFF-set of j or of k: then no single term can serve both, so a
 * set of pairwise independent points needs that many distinct terms.
 */
import type { Cube } from "../logic";
import { popcount } from "../logic";

export interface PointOracle {
  /** True when the cube provably meets OFF of output j; false when it does not or it cannot tell cheaply. */
  meetsOff(c: Cube, j: number): boolean;
}

export interface BoundPoint {
  output: number;
  minterm: number;
}

/** Greedy independent set: the accepted points, per output and overall. */
export function independentPoints(
  candidates: readonly BoundPoint[],
  oracle: PointOracle,
  full: number,
  deadline: number,
): { total: number; perOutput: Map<number, number> } {
  const accepted: BoundPoint[] = [];
  const perOutput = new Map<number, number>();
  const perList = new Map<number, number[]>();
  let tick = 0;
  for (const p of candidates) {
    if ((++tick & 63) === 0 && Date.now() > deadline) break;
    const sup = (q: number): Cube => {
      const mask = (full & ~(p.minterm ^ q)) >>> 0;
      return { value: (p.minterm & mask) >>> 0, mask };
    };
    let ok = true;
    for (const a of accepted) {
      const c = sup(a.minterm);
      if (!(oracle.meetsOff(c, p.output) || (a.output !== p.output && oracle.meetsOff(c, a.output)))) {
        ok = false;
        break;
      }
    }
    // Independence within one output alone is weaker, so it is tracked separately.
    const own = perList.get(p.output) ?? [];
    let ownOk = true;
    for (const q of own) {
      if (!oracle.meetsOff(sup(q), p.output)) {
        ownOk = false;
        break;
      }
    }
    if (ok || ownOk) {
      own.push(p.minterm);
      perList.set(p.output, own);
      perOutput.set(p.output, own.length);
    }
    if (ok) accepted.push(p);
  }
  return { total: accepted.length, perOutput };
}

/** Oracle on truth tables: enumerates the cube's points (up to 2^maxFree) looking for an OFF point. */
export function tableOracle(care: Uint32Array[], n: number, maxFree = 12): PointOracle {
  const full = n >= 32 ? 0xffffffff : 2 ** n - 1;
  return {
    meetsOff(c, j) {
      const free = (full & ~c.mask) >>> 0;
      if (popcount(free) > maxFree) return false;
      const t = care[j]!;
      let sub = 0;
      for (;;) {
        const m = (c.value | sub) >>> 0;
        if (((t[m >>> 5]! >>> (m & 31)) & 1) === 0) return true;
        if (sub === free) return false;
        sub = ((sub - free) & free) >>> 0;
      }
    },
  };
}

/** Oracle on OFF cube lists. */
export function cubeOracle(off: Cube[][]): PointOracle {
  return {
    meetsOff(c, j) {
      for (const r of off[j]!) if (((r.value ^ c.value) & r.mask & c.mask) === 0) return true;
      return false;
    },
  };
}
