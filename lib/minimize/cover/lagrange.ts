/**
 * The Lagrangian bound of a node: subgradient steps on the row multipliers
 * (and the budget's, under a column budget), then a coordinate ascent. The
 * bound holds for any multipliers ≥ 0; the reduced costs at the best ones
 * fix columns.
 */
import { members } from "./core";
import { roundCover } from "./primal";
import type { Search } from "./state";

/**
 * Lagrangian bound of the set-cover relaxation by subgradient steps,
 * warm-started from `u` (updated in place). Returns the best bound and the
 * reduced costs at that bound; a column whose reduced cost lifts the bound
 * to the incumbent cannot be in a better cover.
 */
export function lagrange(
  s: Search,
  rowsA: Uint32Array,
  colsA: Uint32Array,
  u: Float64Array,
  /** At the root: more steps, a larger first step, and the root's ascent sweeps. */
  atRoot: boolean,
  gapTarget: number,
  /** Column budget K ≥ 0 relaxed with the multiplier u[R], or -1. */
  K = -1,
  /** When given, the primal heuristic runs on improving multipliers and the target follows the incumbent. */
  heur?: { cost: number; here: number[] },
): { lb: number; rc: Float64Array; liveCols: number[] } {
  const core = s.core;
  const liveRows = members(rowsA);
  const liveCols = members(colsA);
  // Live rows of the live columns, flattened (CSR) so the inner loop allocates nothing.
  if (s.csr.length < core.nnz) s.csr = new Int32Array(core.nnz);
  const csr = s.csr;
  const start = new Int32Array(liveCols.length + 1);
  let nz = 0;
  for (let i = 0; i < liveCols.length; i++) {
    start[i] = nz;
    const l = core.cols[liveCols[i]!]!;
    for (let q = 0; q < l.length; q++) {
      const r = l[q]!;
      if ((rowsA[r >>> 5]! >>> (r & 31)) & 1) csr[nz++] = r;
    }
  }
  start[liveCols.length] = nz;
  const C = core.cols.length;
  if (s.rcBuf.length < C) {
    s.rcBuf = new Float64Array(C);
    s.gBuf = new Float64Array(core.R);
  }
  const rc = s.rcBuf;
  const bestRc = new Float64Array(C);
  const g = s.gBuf;
  let best = -Infinity;
  const iters = atRoot ? s.tuning.rootIters : s.tuning.nodeIters;
  let lambda = atRoot ? 2 : s.tuning.nodeLambda;
  let stall = 0;
  const R = core.R;
  let lastHeur = -Infinity;
  const bestU = new Float64Array(u.length);
  for (let it = 0; it < iters; it++) {
    // A large root's steps take seconds: the deadline stops them (the best bound so far stands).
    if ((it & 15) === 15 && atRoot && Date.now() > s.deadline) break;
    let L = 0;
    for (const r of liveRows) {
      L += u[r]!;
      g[r] = 1;
    }
    const mu = K >= 0 ? u[R]! : 0;
    if (K >= 0) L -= mu * K;
    let used = 0;
    for (let i = 0; i < liveCols.length; i++) {
      const c = liveCols[i]!;
      let s = core.w[c]! + mu;
      const a = start[i]!;
      const b = start[i + 1]!;
      for (let q = a; q < b; q++) s -= u[csr[q]!]!;
      rc[c] = s;
      if (s < 0) {
        L += s;
        used++;
        for (let q = a; q < b; q++) g[csr[q]!]!--;
      }
    }
    const gmu = K >= 0 ? used - K : 0;
    if (L > best + 1e-9) {
      best = L;
      for (const c of liveCols) bestRc[c] = rc[c]!;
      bestU.set(u);
      stall = 0;
    } else if (++stall >= s.tuning.stall) {
      lambda /= 2;
      stall = 0;
    }
    if (heur && it % s.tuning.heurEvery === s.tuning.heurEvery - 1 && best > lastHeur) {
      lastHeur = best;
      roundCover(s, rowsA, colsA, bestRc, liveCols, heur.cost, heur.here);
      gapTarget = Math.min(gapTarget, s.best - heur.cost);
    }
    let norm = gmu * gmu;
    for (const r of liveRows) norm += g[r]! * g[r]!;
    // Weights are integers: a bound within 1 of the target already closes the gap.
    if (norm === 0 || Math.ceil(best - 1e-6) >= gapTarget) break;
    const target = Number.isFinite(gapTarget) ? gapTarget : 1.05 * Math.abs(L) + 1;
    const t = (lambda * (target - L)) / norm;
    for (const r of liveRows) {
      const v = u[r]! + t * g[r]!;
      u[r] = v > 0 ? v : 0;
    }
    if (K >= 0) u[R] = Math.max(0, mu + t * gmu);
    if (lambda < 1e-4) break;
  }
  const sweeps = atRoot ? s.tuning.rootAscent : s.tuning.ascent;
  if (sweeps > 0 && best > -Infinity && !(Math.ceil(best - 1e-6) >= gapTarget)) {
    const asc = ascend(s, liveRows, liveCols, start, csr, bestU, K, sweeps);
    if (asc.lb > best) {
      best = asc.lb;
      for (const c of liveCols) bestRc[c] = asc.rc[c]!;
    }
  }
  if (best > -Infinity) u.set(bestU);
  return { lb: best, rc: bestRc, liveCols };
}

/**
 * Coordinate ascent on the Lagrangian from `u` (changed in place): each row
 * multiplier moves to where its cheapest live column's reduced cost reaches
 * zero, which never lowers the bound; then the budget multiplier moves to
 * where exactly K columns have negative reduced cost. Returns the bound and
 * the reduced costs at the final multipliers.
 */
export function ascend(
  s: Search,
  liveRows: number[],
  liveCols: number[],
  start: Int32Array,
  csr: Int32Array,
  u: Float64Array,
  K: number,
  sweeps: number,
): { lb: number; rc: Float64Array } {
  const core = s.core;
  const R = core.R;
  const C = core.cols.length;
  const rc = new Float64Array(C);
  // Rows → positions of live columns (transpose of the column lists).
  const rs = new Int32Array(R + 1);
  for (let q = 0; q < start[liveCols.length]!; q++) rs[csr[q]! + 1]!++;
  for (let r = 0; r < R; r++) rs[r + 1]! += rs[r]!;
  const fill = rs.slice(0, R);
  const rowColIdx = new Int32Array(start[liveCols.length]!);
  for (let i = 0; i < liveCols.length; i++) for (let q = start[i]!; q < start[i + 1]!; q++) rowColIdx[fill[csr[q]!]!++] = i;
  const a = new Float64Array(liveCols.length);
  let mu = K >= 0 ? u[R]! : 0;
  for (let i = 0; i < liveCols.length; i++) {
    let v = core.w[liveCols[i]!]!;
    for (let q = start[i]!; q < start[i + 1]!; q++) v -= u[csr[q]!]!;
    a[i] = v;
  }
  const sorted = K >= 0 ? new Float64Array(liveCols.length) : a;
  for (let sw = 0; sw < sweeps; sw++) {
    for (const r of liveRows) {
      const ur = u[r]!;
      let m1 = Infinity;
      let m2 = Infinity;
      for (let q = rs[r]!; q < rs[r + 1]!; q++) {
        const v = a[rowColIdx[q]!]! + mu + ur;
        if (v < m1) {
          m2 = m1;
          m1 = v;
        } else if (v < m2) m2 = v;
      }
      const target = s.tuning.ascentMid > 0 && Number.isFinite(m2) ? m1 + s.tuning.ascentMid * (m2 - m1) : m1;
      const nu = target > 0 ? target : 0;
      if (nu === ur || !Number.isFinite(nu)) continue;
      u[r] = nu;
      const d = nu - ur;
      for (let q = rs[r]!; q < rs[r + 1]!; q++) a[rowColIdx[q]!]! -= d;
    }
    if (K >= 0) {
      sorted.set(a);
      sorted.sort();
      mu = K < liveCols.length ? Math.max(0, -sorted[K]!) : 0;
    }
  }
  let L = 0;
  for (const r of liveRows) L += u[r]!;
  L -= K >= 0 ? mu * K : 0;
  for (let i = 0; i < liveCols.length; i++) {
    const v = a[i]! + mu;
    rc[liveCols[i]!] = v;
    if (v < 0) L += v;
  }
  if (K >= 0) u[R] = mu;
  return { lb: L, rc };
}
