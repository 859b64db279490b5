/** The first incumbent of a search: a greedy cover, then its redundant columns dropped. */
import { ScoreHeap } from "./heap";
import type { Search } from "./state";

/** Greedy cover (weight per newly covered row), then redundant columns dropped: the first incumbent. */
export function greedy(s: Search, rowsA0: Uint32Array, colsA0: Uint32Array): void {
  const core = s.core;
  // Sparse: per column, how many live rows it still reaches.
  const C = core.cols.length;
  const rowCols: number[][] = Array.from({ length: core.R }, () => []);
  const left = new Int32Array(C);
  const coveredRow = new Uint8Array(core.R);
  for (let r = 0; r < core.R; r++) if (!((rowsA0[r >>> 5]! >>> (r & 31)) & 1)) coveredRow[r] = 1;
  for (let c = 0; c < C; c++) {
    if (!((colsA0[c >>> 5]! >>> (c & 31)) & 1)) continue;
    for (const r of core.cols[c]!) {
      if (coveredRow[r]) continue;
      rowCols[r]!.push(c);
      left[c]!++;
    }
  }
  let remaining = 0;
  for (let r = 0; r < core.R; r++) if (!coveredRow[r]) remaining++;
  const chosen: number[] = [];
  // The column of highest score (lowest index among equals), from a heap of scores that can only fall:
  // an entry whose stored score is still its score is the maximum; a stale one goes back with its score.
  const heap = new ScoreHeap(C);
  for (let c = 0; c < C; c++) if (left[c]! > 0) heap.push(left[c]! / core.w[c]!, c);
  while (remaining > 0) {
    let bestC = -1;
    while (heap.size > 0) {
      const c = heap.topCol();
      const stored = heap.topScore();
      heap.pop();
      if (left[c] === 0) continue;
      const score = left[c]! / core.w[c]!;
      if (score === stored) {
        bestC = c;
        break;
      }
      heap.push(score, c);
    }
    if (bestC < 0) return;
    chosen.push(bestC);
    for (const r of core.cols[bestC]!) {
      if (coveredRow[r]) continue;
      coveredRow[r] = 1;
      remaining--;
      for (const c of rowCols[r]!) left[c]!--;
    }
  }
  // Drop columns whose rows the others cover, most expensive first.
  const order = chosen.slice().sort((a, b) => core.w[b]! - core.w[a]!);
  const count = new Int32Array(core.R);
  for (const c of chosen) for (const r of core.cols[c]!) count[r]!++;
  const keep = new Set(chosen);
  for (const c of order) {
    if (core.cols[c]!.every((r) => count[r]! > 1)) {
      keep.delete(c);
      for (const r of core.cols[c]!) count[r]!--;
    }
  }
  const list = [...keep];
  const wsum = list.reduce((a, c) => a + core.w[c]!, 0);
  if (wsum < s.best) {
    s.best = wsum;
    s.bestChosen = list;
  }
}
