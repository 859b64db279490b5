/**
 * The branch-and-bound over a core: at each node the reductions, the
 * independent-row bound, at LP nodes the LP bound, the Lagrangian bound with
 * reduced-cost fixing, then branching on the row with the fewest live
 * columns, most promising column first.
 */
import { members } from "./core";
import { greedy } from "./greedy";
import { independentRows } from "./independent";
import { lagrange } from "./lagrange";
import { dive, lpBound, type LpNode } from "./lp-node";
import { improveIncumbent } from "./local";
import { lpRounding, roundCover } from "./primal";
import { reduce } from "./reduce";
import type { Search } from "./state";

function sameBits(a: Uint32Array, b: Uint32Array): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}

/** Runs the search from the whole core; the result is over core columns. */
export function run(s: Search): { chosen: number[]; weight: number; lowerBound: number; exact: boolean } {
  const core = s.core;
  const rowsA = new Uint32Array(core.WR);
  for (let r = 0; r < core.R; r++) rowsA[r >>> 5]! |= 1 << (r & 31);
  const colsA = new Uint32Array(core.WC);
  for (let c = 0; c < core.cols.length; c++) colsA[c >>> 5]! |= 1 << (c & 31);
  // A root-only search takes its incumbent from the LP's rounding.
  if (s.card < 0 && !s.rootOnly) greedy(s, rowsA, colsA);
  s.report();
  const u = new Float64Array(core.R + 1);
  for (let r = 0; r < core.R; r++) u[r] = Infinity;
  // Start the budget multiplier where the combined products-then-literals weight would put it.
  u[core.R] = s.card >= 0 && s.bestChosen.length ? Math.max(1, s.best / s.bestChosen.length) : 0;
  for (let c = 0; c < core.cols.length; c++) {
    const share = core.w[c]! / core.cols[c]!.length;
    for (const r of core.cols[c]!) if (share < u[r]!) u[r] = share;
  }
  if (core.sparseOnly) {
    const lag = lagrange(s, rowsA, colsA, u, true, s.best, s.card);
    if (s.card < 0 && s.unicost && core.R >= s.tuning.localMinRows) {
      const target = Math.ceil(lag.lb - 1e-6);
      const share = Math.max(0, s.deadline - Date.now()) * s.tuning.localTimeShare;
      improveIncumbent(s, rowsA, colsA, 0, [], target, s.tuning.localStepsPerRow * core.R, Date.now() + share, lag.rc);
    }
    const lb = Math.min(s.best, Math.max(independentRows(s.core, rowsA, colsA).lb, Math.ceil(lag.lb - 1e-6)));
    s.rootBound = Math.max(s.rootBound, lb);
    s.report();
    return { chosen: s.bestChosen, weight: s.best, lowerBound: lb, exact: lb === s.best };
  }
  search(s, rowsA, colsA, 0, [], u, 0);
  const exact = !s.aborted;
  return {
    chosen: s.bestChosen,
    weight: s.best,
    lowerBound: exact ? s.best : Math.min(s.best, Math.max(0, s.rootBound)),
    exact,
  };
}

export function search(s: Search, rowsA: Uint32Array, colsA: Uint32Array, cost: number, chosen: number[], u: Float64Array, depth: number): void {
  const core = s.core;
  if (s.aborted) return;
  if ((++s.nodes & 63) === 0) {
    if (Date.now() > s.deadline) {
      s.aborted = true;
      return;
    }
    s.report();
  }
  const picked: number[] = [];
  const add = reduce(s, rowsA, colsA, picked, depth === 0 ? 3 : s.tuning.nodeDominance);
  if (add < 0) return;
  cost += add;
  const here = chosen.concat(picked);
  if (depth === 0) {
    s.rootLive = colsA.slice();
    s.rootTaken = here.slice().sort((a, b) => a - b);
    // Cuts found by an earlier search hold here when its root left the same columns live and taken.
    const pool = s.cutsIn;
    if (pool && sameBits(pool.live, s.rootLive) && pool.taken.length === here.length && pool.taken.every((c, i) => c === s.rootTaken[i])) {
      for (const cut of pool.cuts) s.cuts.push(cut);
    }
  }
  const K = s.card < 0 ? -1 : s.card - here.length;
  if (s.card >= 0 && K < 0) return;
  const { lb, branchRow, independent } = independentRows(s.core, rowsA, colsA);
  if (K >= 0 && branchRow >= 0 && independent > K) return;
  if (branchRow < 0) {
    if (cost < s.best) {
      s.best = cost;
      s.bestChosen = here.slice();
    }
    return;
  }
  if (cost + lb >= s.best) return;
  let lpFix: { lb: number; rc: Float64Array } | null = null;
  if (s.rootOnly) {
    // Root only: the LP relaxation and its rounding, no subgradient steps; the search stops unless they close the gap.
    const res = lpBound(s, rowsA, members(colsA), K, -Infinity, s.tuning.rootOnlyMaxRows, here, { cutRounds: s.tuning.rootCutRounds, cost, colsA });
    if (res && res !== "infeasible") {
      if (res.lp && cost + Math.ceil(res.lb - 1e-6) < s.best) dive(s, res.lp, res.liveCols, res.solveAll, rowsA, colsA, cost, here);
      res.lp?.release();
      res.lp = null;
      s.rootBound = Math.max(s.rootBound, cost + lb, cost + Math.ceil(res.lb - 1e-6));
      if (cost + Math.ceil(res.lb - 1e-6) >= s.best) return;
    }
    s.aborted = true;
    return;
  }
  // In the literal phase the root solves its LP first: when the LP's rounding meets the LP bound,
  // the root's subgradient steps would only confirm it.
  let rootLp: LpNode | null = null;
  if (depth === 0 && K >= 0 && depth <= s.tuning.lpDepth) {
    const res = lpBound(s, rowsA, members(colsA), K, -Infinity, s.tuning.lpMaxRows, here, { cutRounds: s.tuning.cutRounds, cost, colsA });
    if (res === "infeasible") return;
    if (res) {
      if (res.lp && cost + Math.ceil(res.lb - 1e-6) < s.best) dive(s, res.lp, res.liveCols, res.solveAll, rowsA, colsA, cost, here);
      res.lp?.release();
      res.lp = null;
      if (cost + Math.ceil(res.lb - 1e-6) >= s.best) {
        s.rootBound = Math.max(s.rootBound, cost + Math.ceil(res.lb - 1e-6));
        return;
      }
      rootLp = res;
    }
  }
  // Lagrangian bound and reduced-cost fixing.
  // A large root of fewest columns hands its incumbent to the local search, which improves it far more than the
  // Lagrangian heuristic's roundings would, and those cost most of such a root's steps (random 14-input roots:
  // 1.5 s of 2.4 s): the steps run without them there.
  const localRoot = depth === 0 && s.card < 0 && s.unicost && members(rowsA).length >= s.tuning.localMinRows;
  const lag = lagrange(s, rowsA, colsA, u, depth === 0, s.best - cost, K, depth <= s.tuning.heurDepth && !localRoot ? { cost, here } : undefined);
  if (cost + Math.ceil(lag.lb - 1e-6) >= s.best) return;
  // The LP's bound and reduced costs fix columns too; branching keeps the
  // subgradient's order (the LP's many zero reduced costs ordered it worse in trials).
  if (rootLp) lpFix = rootLp;
  else if (depth <= s.tuning.lpDepth && K >= 0) {
    // Subgradient steps stall short of the LP optimum; the simplex duals close that gap
    // (at every node: both covering phases of the eleven random 10-input bench cases took 0.7× the time of root only).
    const res = lpBound(s, rowsA, lag.liveCols, K, lag.lb, s.tuning.lpMaxRows, here);
    // No fractional cover fits the budget: neither does a cover.
    if (res === "infeasible") return;
    if (res) {
      lpRounding(s, rowsA, colsA, res.x, lag.liveCols, cost, here);
      if (cost + Math.ceil(res.lb - 1e-6) >= s.best) return;
      lpFix = res;
    }
  }
  if (lpFix && !(lpFix.lb > lag.lb)) lpFix = null;
  const lbBest = lpFix ? lpFix.lb : lag.lb;
  if (depth === 0) {
    s.rootBound = Math.max(s.rootBound, cost + lb, cost + Math.ceil(lbBest - 1e-6));
    s.report();
  }
  if (depth <= s.tuning.heurDepth) {
    roundCover(s, rowsA, colsA, lag.rc, lag.liveCols, cost, here);
    const target = cost + Math.ceil(lbBest - 1e-6);
    if (localRoot && target < s.best) {
      const share = Math.max(0, s.deadline - Date.now()) * s.tuning.localTimeShare;
      improveIncumbent(s, rowsA, colsA, cost, here, target - cost, s.tuning.localStepsPerRow * members(rowsA).length, Date.now() + share, lag.rc);
      s.report();
    }
    if (cost + Math.ceil(lbBest - 1e-6) >= s.best) return;
  }
  let fixed = false;
  for (const c of lag.liveCols) {
    const r = lag.rc[c]!;
    const r2 = lpFix ? lpFix.rc[c]! : 0;
    if ((r > 0 && cost + Math.ceil(lag.lb + r - 1e-6) >= s.best) || (r2 > 0 && cost + Math.ceil(lpFix!.lb + r2 - 1e-6) >= s.best)) {
      colsA[c >>> 5]! &= ~(1 << (c & 31));
      fixed = true;
    }
  }
  let branch = branchRow;
  if (fixed) {
    const more: number[] = [];
    const add2 = reduce(s, rowsA, colsA, more, s.tuning.nodeDominance);
    if (add2 < 0) return;
    if (more.length) {
      cost += add2;
      for (const c of more) here.push(c);
    }
    const b2 = independentRows(s.core, rowsA, colsA);
    if (b2.branchRow < 0) {
      if (cost < s.best) {
        s.best = cost;
        s.bestChosen = here.slice();
      }
      return;
    }
    if (cost + b2.lb >= s.best) return;
    if (K >= 0 && (more.length > K || b2.independent > K - more.length)) return;
    branch = b2.branchRow;
  }
  const cand: number[] = [];
  core.colsOfRow(branch, colsA, cand);
  // Most promising first: lowest reduced cost.
  cand.sort((a, b) => lag.rc[a]! - lag.rc[b]!);
  const cols = colsA.slice();
  for (const c of cand) {
    const r2 = rowsA.slice();
    const c2 = cols.slice();
    core.take(c, r2, c2);
    here.push(c);
    search(s, r2, c2, cost + core.w[c]!, here, u.slice(), depth + 1);
    here.pop();
    if (s.aborted) return;
    // Later branches exclude the columns already explored at this node.
    cols[c >>> 5]! &= ~(1 << (c & 31));
  }
}
