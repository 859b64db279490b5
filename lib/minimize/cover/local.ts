/**
 * A local search for covers of fewest columns (every column weighing the
 * same): row weighting with configuration checking, after Gao, Weise and Li,
 * "An efficient local search heuristic with row weighting for the unicost
 * set covering problem" (European Journal of Operational Research, 2015).
 *
 * From a cover it drops a column, then walks among sets one column short of
 * that size: each step removes the column whose removal loses the least row
 * weight, and adds, for a random uncovered row, the column that gains the
 * most; rows left uncovered grow heavier, so the walk is pushed away from
 * where it keeps failing. A column removed may come back only after one of
 * its neighbours (columns sharing a row) changed. Whenever the set covers
 * every row it is the best so far, and the walk goes on one column shorter.
 * It only ever proposes covers: whatever it finds is checked by the caller's
 * bounds like any incumbent.
 */

import { members } from "./core";
import type { Search } from "./state";

/** The cover problem in sparse form over local indices. */
export interface LocalProblem {
  rowCount: number;
  /** colRows[c]: the rows of column c. */
  colRows: ArrayLike<number>[];
  /** rowCols[r]: the columns of row r. */
  rowCols: ArrayLike<number>[];
}

export interface LocalLimits {
  /** Stop as soon as a cover of this many columns is found (a proven lower bound, or 0). */
  target: number;
  /** Steps at most (one removal and one addition each). */
  maxSteps: number;
  /** Date.now() milliseconds after which the search stops. */
  deadline: number;
  /** Seed of the random choices: the same seed and steps give the same result. */
  seed?: number;
}

/** Candidates drawn from the set when choosing the column to remove ("best from multiple selections"). */
const SAMPLE = 48;

/**
 * The smallest cover found from `start` (a cover; returned unchanged when no
 * smaller one turns up).
 */
export function unicostLocalSearch(p: LocalProblem, start: readonly number[], limits: LocalLimits): number[] {
  if (start.length <= limits.target) return start.slice();
  const { rowCount: R, colRows, rowCols } = p;
  const C = colRows.length;
  const inSet = new Uint8Array(C);
  const count = new Int32Array(R);
  const weight = new Float64Array(R).fill(1);
  const score = new Float64Array(C);
  // Configuration checking: a column may be added only when a neighbour changed since it was removed.
  const conf = new Uint8Array(C).fill(1);
  const stamp = new Float64Array(C);
  // The set and the uncovered rows as lists with positions, for O(1) removal.
  const set = new Int32Array(C);
  const setAt = new Int32Array(C).fill(-1);
  let setLen = 0;
  const uncovered = new Int32Array(R);
  const uncAt = new Int32Array(R).fill(-1);
  let uncLen = 0;
  let rnd = (limits.seed ?? 0x2545f491) >>> 0 || 1;
  const random = (k: number): number => {
    rnd ^= rnd << 13;
    rnd ^= rnd >>> 17;
    rnd ^= rnd << 5;
    rnd >>>= 0;
    return rnd % k;
  };

  for (let r = 0; r < R; r++) {
    uncAt[r] = uncLen;
    uncovered[uncLen++] = r;
  }
  const uncover = (r: number) => {
    uncAt[r] = uncLen;
    uncovered[uncLen++] = r;
  };
  const cover = (r: number) => {
    const i = uncAt[r]!;
    const last = uncovered[--uncLen]!;
    uncovered[i] = last;
    uncAt[last] = i;
    uncAt[r] = -1;
  };
  const touchNeighbours = (c: number) => {
    const rs = colRows[c]!;
    for (let i = 0; i < rs.length; i++) {
      const cs = rowCols[rs[i]!]!;
      for (let k = 0; k < cs.length; k++) conf[cs[k]!] = 1;
    }
  };
  /** The one column of the set covering row r other than `not`. */
  const soleCover = (r: number, not: number): number => {
    const cs = rowCols[r]!;
    for (let k = 0; k < cs.length; k++) {
      const d = cs[k]!;
      if (d !== not && inSet[d]) return d;
    }
    return -1;
  };
  const add = (c: number) => {
    inSet[c] = 1;
    setAt[c] = setLen;
    set[setLen++] = c;
    const rs = colRows[c]!;
    let own = 0;
    for (let i = 0; i < rs.length; i++) {
      const r = rs[i]!;
      const k = ++count[r]!;
      if (k === 1) {
        cover(r);
        const cs = rowCols[r]!;
        for (let q = 0; q < cs.length; q++) if (cs[q] !== c) score[cs[q]!]! -= weight[r]!;
        own += weight[r]!;
      } else if (k === 2) {
        const e = soleCover(r, c);
        if (e >= 0) score[e]! += weight[r]!;
      }
    }
    score[c] = -own;
    touchNeighbours(c);
  };
  const remove = (c: number) => {
    inSet[c] = 0;
    const i = setAt[c]!;
    const last = set[--setLen]!;
    set[i] = last;
    setAt[last] = i;
    setAt[c] = -1;
    const rs = colRows[c]!;
    let gain = 0;
    for (let q = 0; q < rs.length; q++) {
      const r = rs[q]!;
      const k = --count[r]!;
      if (k === 0) {
        uncover(r);
        const cs = rowCols[r]!;
        for (let t = 0; t < cs.length; t++) if (cs[t] !== c) score[cs[t]!]! += weight[r]!;
        gain += weight[r]!;
      } else if (k === 1) {
        const e = soleCover(r, -1);
        if (e >= 0) score[e]! -= weight[r]!;
      }
    }
    score[c] = gain;
    touchNeighbours(c);
    conf[c] = 0;
  };

  // Scores of a set: a member's is minus the weight of the rows only it covers, an outsider's the weight of the uncovered rows it covers.
  for (const c of start) if (!inSet[c]) add(c);
  if (uncLen > 0) return start.slice();
  let best = Array.from(set.subarray(0, setLen));
  let tabu = -1;
  for (let step = 0; step < limits.maxSteps && best.length > limits.target; step++) {
    if ((step & 1023) === 1023 && Date.now() > limits.deadline) break;
    while (uncLen === 0) {
      if (setLen < best.length) best = Array.from(set.subarray(0, setLen));
      if (best.length <= limits.target) return best;
      // A cover: drop the column whose rows the others miss least, and go on one column short.
      let pick = -1;
      for (let i = 0; i < setLen; i++) {
        const c = set[i]!;
        if (pick < 0 || score[c]! > score[pick]! || (score[c] === score[pick] && stamp[c]! < stamp[pick]!)) pick = c;
      }
      remove(pick);
      stamp[pick] = step;
    }
    // Remove: the member losing least, from a sample of the set; not the column just added.
    let out = -1;
    const draws = setLen <= SAMPLE ? setLen : SAMPLE;
    for (let k = 0; k < draws; k++) {
      const c = setLen <= SAMPLE ? set[k]! : set[random(setLen)]!;
      if (c === tabu) continue;
      if (out < 0 || score[c]! > score[out]! || (score[c] === score[out] && stamp[c]! < stamp[out]!)) out = c;
    }
    if (out >= 0) {
      remove(out);
      stamp[out] = step;
    }
    // Add: for a random uncovered row, its column gaining most among those allowed back.
    const r = uncovered[random(uncLen)]!;
    const cs = rowCols[r]!;
    let into = -1;
    for (let k = 0; k < cs.length; k++) {
      const c = cs[k]!;
      if (!conf[c]) continue;
      if (into < 0 || score[c]! > score[into]! || (score[c] === score[into] && stamp[c]! < stamp[into]!)) into = c;
    }
    if (into < 0) into = cs[random(cs.length)]!;
    add(into);
    stamp[into] = step;
    tabu = into;
    // Rows still uncovered weigh more: the columns that would cover them gain.
    for (let i = 0; i < uncLen; i++) {
      const u = uncovered[i]!;
      weight[u]! += 1;
      const us = rowCols[u]!;
      for (let k = 0; k < us.length; k++) score[us[k]!]! += 1;
    }
  }
  return best;
}

/**
 * At a search's root, for covers of fewest columns: the local search on the
 * live rows and the live columns of small reduced cost, from the incumbent's
 * live columns (completed, where they miss a row, by the row's first live
 * column), until a cover of `target` columns or its limits. A smaller cover
 * becomes the incumbent.
 */
export function improveIncumbent(
  s: Search,
  rowsA: Uint32Array,
  colsA: Uint32Array,
  cost: number,
  here: number[],
  target: number,
  maxSteps: number,
  deadline: number,
  /** Reduced costs at the root's best multipliers: columns far above zero are left out (see CoverTuning.localTheta). */
  rc: Float64Array,
): void {
  const core = s.core;
  const liveRows = members(rowsA);
  let liveCols = members(colsA);
  const theta = s.tuning.localTheta;
  if (Number.isFinite(theta)) {
    const keep = new Uint8Array(core.cols.length);
    for (const c of liveCols) if (rc[c]! < theta) keep[c] = 1;
    for (const c of s.bestChosen) keep[c] = 1;
    for (const r of liveRows) {
      let any = false;
      let bestC = -1;
      for (const c of core.rowColsS[r]!) {
        if (!((colsA[c >>> 5]! >>> (c & 31)) & 1)) continue;
        if (keep[c]) any = true;
        if (bestC < 0 || rc[c]! < rc[bestC]!) bestC = c;
      }
      if (!any && bestC >= 0) keep[bestC] = 1;
    }
    liveCols = liveCols.filter((c) => keep[c]);
  }
  const rowAt = new Int32Array(core.R).fill(-1);
  liveRows.forEach((r, i) => (rowAt[r] = i));
  const colAt = new Int32Array(core.cols.length).fill(-1);
  liveCols.forEach((c, i) => (colAt[c] = i));
  const colRows: Int32Array[] = liveCols.map((c) => Int32Array.from(Array.from(core.cols[c]!).filter((r) => rowAt[r]! >= 0), (r) => rowAt[r]!));
  const rowCols: Int32Array[] = liveRows.map((r) => Int32Array.from(Array.from(core.rowColsS[r]!).filter((c) => colAt[c]! >= 0), (c) => colAt[c]!));
  const start: number[] = [];
  const covered = new Uint8Array(liveRows.length);
  const take = (i: number) => {
    start.push(i);
    for (const r of colRows[i]!) covered[r] = 1;
  };
  for (const c of s.bestChosen) if (colAt[c]! >= 0) take(colAt[c]!);
  for (let r = 0; r < liveRows.length; r++) if (!covered[r] && rowCols[r]!.length > 0) take(rowCols[r]![0]!);
  const found = unicostLocalSearch({ rowCount: liveRows.length, colRows, rowCols }, start, { target, maxSteps, deadline });
  const w = cost + found.length;
  if (w < s.best) {
    s.best = w;
    s.bestChosen = here.concat(found.map((i) => liveCols[i]!));
  }
}
