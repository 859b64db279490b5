/** Covers built from a node's reduced costs or LP solution, offered as incumbents. */
import type { Search } from "./state";

/**
 * Lagrangian primal heuristic: the columns of negative reduced cost, then
 * the cheapest per newly covered row, then redundant columns dropped
 * (costliest first). Offers the result as incumbent when it beats it.
 */
export function roundCover(s: Search, rowsA: Uint32Array, colsA: Uint32Array, rc: Float64Array, liveCols: number[], cost: number, here: number[]): void {
  const core = s.core;
  const need = rowsA.slice();
  const isNeeded = (r: number) => ((need[r >>> 5]! >>> (r & 31)) & 1) === 1;
  const chosen: number[] = [];
  // Only the columns of negative reduced cost are taken in order: sort just those (stable, as the full sort was).
  const order: number[] = [];
  for (let i = 0; i < liveCols.length; i++) if (rc[liveCols[i]!]! < 0) order.push(liveCols[i]!);
  order.sort((a, b) => rc[a]! - rc[b]!);
  const takeCol = (c: number) => {
    chosen.push(c);
    const l = core.cols[c]!;
    for (let i = 0; i < l.length; i++) need[l[i]! >>> 5]! &= ~(1 << (l[i]! & 31));
  };
  for (const c of order) {
    if (rc[c]! >= 0) break;
    const l = core.cols[c]!;
    for (let i = 0; i < l.length; i++) {
      if (isNeeded(l[i]!)) {
        takeCol(c);
        break;
      }
    }
  }
  const tmp: number[] = [];
  for (let k = 0; k < core.WR; k++) {
    while (need[k]! !== 0) {
      const x = need[k]!;
      const r = k * 32 + 31 - Math.clz32(x & -x);
      core.colsOfRow(r, colsA, tmp);
      if (tmp.length === 0) return;
      let bestC = -1;
      let bestScore = Infinity;
      for (const c of tmp) {
        let fresh = 0;
        const l = core.cols[c]!;
        for (let i = 0; i < l.length; i++) if (isNeeded(l[i]!)) fresh++;
        const score = (core.w[c]! + Math.max(0, rc[c]!)) / fresh;
        if (score < bestScore) {
          bestScore = score;
          bestC = c;
        }
      }
      takeCol(bestC);
    }
  }
  // Redundant columns, costliest first; only live rows count.
  const count = new Int32Array(core.R);
  for (const c of chosen) for (const r of core.cols[c]!) count[r]!++;
  chosen.sort((a, b) => core.w[b]! - core.w[a]! || rc[b]! - rc[a]!);
  let w = cost;
  const kept: number[] = [];
  for (const c of chosen) {
    const l = core.cols[c]!;
    let redundant = true;
    for (let i = 0; i < l.length; i++) {
      const r = l[i]!;
      if (((rowsA[r >>> 5]! >>> (r & 31)) & 1) && count[r]! < 2) {
        redundant = false;
        break;
      }
    }
    if (redundant) {
      for (let i = 0; i < l.length; i++) count[l[i]!]!--;
    } else {
      kept.push(c);
      w += core.w[c]!;
    }
  }
  if (s.card >= 0 && here.length + kept.length > s.card) return;
  if (w < s.best) {
    s.best = w;
    s.bestChosen = here.concat(kept);
  }
}

/** LP rounding: the support of the LP solution, largest values first, then the cheapest per new row. */
export function lpRounding(s: Search, rowsA: Uint32Array, colsA: Uint32Array, x: Float64Array, liveCols: number[], cost: number, here: number[]): void {
  const core = s.core;
  const key = new Float64Array(core.cols.length);
  // The support first (a negative key is taken in order); columns at 0 wait for the cheapest-per-new-row step.
  for (const c of liveCols) key[c] = x[c]! > 1e-9 ? -x[c]! : 0;
  roundCover(s, rowsA, colsA, key, liveCols, cost, here);
}
