/**
 * The LP at a node: the covering LP of its live rows and columns under the
 * search's cuts (at the root, with new rounds of cuts), solved by the dual
 * simplex of ../lp with rows added as they are needed; its duals give a
 * proven Lagrangian bound, its solution an incumbent by rounding, and at the
 * root a dive.
 */
import { CoverLp, type LpCut } from "../lp";
import { members } from "./core";
import { lpRounding } from "./primal";
import type { Search } from "./state";

/** A node's LP: its bound and reduced costs (over core columns), the solution, and at a root the solved LP (over `liveCols`). */
export interface LpNode {
  lb: number;
  rc: Float64Array;
  liveCols: number[];
  x: Float64Array;
  /** Kept at a root only, for the dive (then released). */
  lp: CoverLp | null;
  /** Solves an LP of this node's rows (the LP above after changes), adding the rows it leaves under 1; a dive passes track = false. */
  solveAll: (lp: CoverLp, track?: boolean) => "optimal" | "infeasible" | "stopped";
}

/**
 * Lagrangian bound at the duals of the LP relaxation (dense dual simplex on
 * the live rows and columns, budget K ≥ 0 or none, and the search's cuts
 * with taken columns at 1 and dropped ones at 0), relative to the node's
 * cost. With `cutRounds`, new cuts are added round by round while the bound
 * rises and stays below the incumbent; they join the search's cuts, so this
 * is for the root only. The bound is evaluated from the multipliers, so it is proven
 * whatever the simplex's rounding. Returns "infeasible" when the simplex
 * certifies that no fractional cover fits the budget, null when it could
 * not run to the end or the bound does not beat `beat`. The subgradient's
 * multipliers stay as they are: children started from the LP's vertex
 * duals searched up to six times longer in trials.
 */
export function lpBound(
  s: Search,
  rowsA: Uint32Array,
  liveCols: number[],
  K: number,
  beat: number,
  maxRows = s.tuning.lpMaxRows,
  /** The columns taken on the way to this node (at 1 in the cuts). */
  here: number[] = [],
  /**
   * At a root: rounds of Chvátal–Gomory cuts to add (they join the search's cuts, so only where they
   * hold for the whole search), the node's cost (the rounds stop when the bound meets the incumbent),
   * and its live columns (the LP solutions met are rounded for an incumbent). The LP is then kept in
   * the result for a dive; the caller releases it.
   */
  root?: { cutRounds: number; cost: number; colsA: Uint32Array },
): LpNode | "infeasible" | null {
  const core = s.core;
  const cutRounds = root?.cutRounds ?? 0;
  const cost = root?.cost ?? 0;
  const colsA = root?.colsA;
  const liveRows = members(rowsA);
  // The dense inverse costs rows² per pivot: past a few hundred rows the LP costs more than it saves.
  if (liveRows.length > maxRows) return null;
  const local = new Int32Array(core.R).fill(-1);
  for (let i = 0; i < liveRows.length; i++) local[liveRows[i]!] = i;
  // Each live column's live rows (local indices), as one list (column i's rows at cRows[cStart[i]] ..).
  const NL = liveCols.length;
  const cStart = new Int32Array(NL + 1);
  let cells = 0;
  for (const c of liveCols) cells += core.cols[c]!.length;
  const cRows = new Int32Array(cells);
  const w: number[] = [];
  cells = 0;
  for (let i = 0; i < NL; i++) {
    const c = liveCols[i]!;
    const l = core.cols[c]!;
    for (let q = 0; q < l.length; q++) {
      const m = local[l[q]!]!;
      if (m >= 0) cRows[cells++] = m;
    }
    cStart[i + 1] = cells;
    w.push(core.w[c]!);
  }
  // The cuts at this node: taken columns at 1, columns no longer live at 0.
  const lpCuts: LpCut[] = [];
  if (s.cuts.length) {
    const colLocal = new Int32Array(core.cols.length).fill(-1);
    for (let i = 0; i < liveCols.length; i++) colLocal[liveCols[i]!] = i;
    const taken = new Uint8Array(core.cols.length);
    for (const c of here) taken[c] = 1;
    for (const cut of s.cuts) {
      let rhs = cut.rhs;
      let most = 0;
      let least = 0;
      const idx: number[] = [];
      const val: number[] = [];
      for (let k = 0; k < cut.cols.length; k++) {
        const c = cut.cols[k]!;
        const v = cut.val[k]!;
        if (colLocal[c]! >= 0) {
          idx.push(colLocal[c]!);
          val.push(v);
          if (v > 0) most += v;
          else least += v;
        } else if (taken[c]) rhs -= v;
      }
      if (least > rhs) return "infeasible";
      if (most <= rhs) continue;
      lpCuts.push({ cols: Int32Array.from(idx), val: Int32Array.from(val), rhs });
    }
  }
  // Row generation: the LP starts on part of the rows (a greedy set of independent rows, fewest
  // columns first, filled up to half the rows in that order); a row the solution leaves under 1 is
  // added as the row −Σ x ≤ −1 and the dual simplex goes on. The LP then ends optimal for all rows,
  // over fewer of them: its pivots cost rows², and random 10-input roots took a third to a half of the time.
  const RL = liveRows.length;
  const rowGen = RL >= s.tuning.rowGenMin;
  // Rows → live columns (positions in liveCols) and whether each row is in the LP; for row generation only.
  const rowStartF = new Int32Array(rowGen ? RL + 1 : 0);
  let rowColsF = new Int32Array(0);
  const inLp = new Uint8Array(rowGen ? RL : 0);
  let lpCols: Int32Array[];
  let lpRows = RL;
  if (!rowGen) {
    lpCols = [];
    for (let i = 0; i < NL; i++) lpCols.push(cRows.subarray(cStart[i]!, cStart[i + 1]!));
  } else {
    for (let e = 0; e < cells; e++) rowStartF[cRows[e]! + 1]!++;
    for (let r = 0; r < RL; r++) rowStartF[r + 1]! += rowStartF[r]!;
    rowColsF = new Int32Array(rowStartF[RL]!);
    const fill = rowStartF.slice(0, RL);
    for (let i = 0; i < NL; i++) for (let e = cStart[i]!; e < cStart[i + 1]!; e++) rowColsF[fill[cRows[e]!]!++] = i;
    // Rows by their count of columns, then by index (a counting sort).
    const order = new Int32Array(RL);
    {
      let most = 0;
      for (let r = 0; r < RL; r++) most = Math.max(most, rowStartF[r + 1]! - rowStartF[r]!);
      const at = new Int32Array(most + 2);
      for (let r = 0; r < RL; r++) at[rowStartF[r + 1]! - rowStartF[r]! + 1]!++;
      for (let k = 0; k <= most; k++) at[k + 1]! += at[k]!;
      for (let r = 0; r < RL; r++) order[at[rowStartF[r + 1]! - rowStartF[r]!]!++] = r;
    }
    const usedCol = new Uint8Array(NL);
    const r0: number[] = [];
    for (const r of order) {
      let free = true;
      for (let e = rowStartF[r]!; e < rowStartF[r + 1]! && free; e++) if (usedCol[rowColsF[e]!]) free = false;
      if (!free) continue;
      inLp[r] = 1;
      r0.push(r);
      for (let e = rowStartF[r]!; e < rowStartF[r + 1]!; e++) usedCol[rowColsF[e]!] = 1;
    }
    for (const r of order) {
      if (r0.length >= s.tuning.rowGenStart * RL) break;
      if (!inLp[r]) {
        inLp[r] = 1;
        r0.push(r);
      }
    }
    const at = new Int32Array(RL).fill(-1);
    r0.forEach((r, i) => (at[r] = i));
    // Views into one buffer, as above (the simplex runs as fast on them as on arrays of their own, measured).
    lpCols = [];
    const flat = new Int32Array(cells);
    let k = 0;
    for (let i = 0; i < NL; i++) {
      const k0 = k;
      for (let e = cStart[i]!; e < cStart[i + 1]!; e++) if (at[cRows[e]!]! >= 0) flat[k++] = at[cRows[e]!]!;
      lpCols.push(flat.subarray(k0, k));
    }
    lpRows = r0.length;
  }
  const maxIters = () => 50 * (RL + lpCuts.length + 1);
  // Room for the rows row generation may add and the first cut rounds' rows; the LP grows when more are added.
  const spare = (cutRounds > 0 || rowGen ? 2 * s.tuning.cutsPerRound + 16 : 0) + (RL - lpRows);
  const lp = new CoverLp(lpRows, lpCols, w, K, lpCuts, spare, s.pool);
  const xRowGen = new Float64Array(NL);
  /** Solves, adding the rows left under 1 until none is. */
  const solveAll = (at: CoverLp, track = true): "optimal" | "infeasible" | "stopped" => {
    let st = at.solve(s.deadline, maxIters());
    while (st === "optimal" && rowGen) {
      const xl = at.primal(xRowGen);
      const short: { r: number; s: number }[] = [];
      for (let r = 0; r < RL; r++) {
        if (inLp[r]) continue;
        let sum = 0;
        for (let e = rowStartF[r]!; e < rowStartF[r + 1]!; e++) sum += xl[rowColsF[e]!]!;
        if (sum < 1 - 1e-9) short.push({ r, s: sum });
      }
      if (short.length === 0) break;
      short.sort((a, b) => a.s - b.s || a.r - b.r);
      const add = short.slice(0, Math.max(8, Math.ceil(short.length / 2))).map(({ r }) => {
        inLp[r] = 1;
        const cut: LpCut = { cols: rowColsF.slice(rowStartF[r]!, rowStartF[r + 1]!), val: new Int32Array(rowStartF[r + 1]! - rowStartF[r]!).fill(-1), rhs: -1 };
        // The node's own LP keeps lpCuts in step with its cut rows (their duals enter the bound); a dive's does not.
        if (track) lpCuts.push(cut);
        return cut;
      });
      at.withCuts(add);
      st = at.solve(s.deadline, maxIters());
    }
    return st;
  };
  let status = solveAll(lp);
  // With `colsA`, every LP solution met is rounded for an incumbent (once: the LP grows in place, its rows and pivots tell its solutions apart).
  let rounded = "";
  const roundAt = (at: CoverLp) => {
    const key = `${at.M}:${at.iterations}`;
    if (rounded === key) return;
    rounded = key;
    const xl = at.primal();
    const xs = new Float64Array(core.cols.length);
    for (let i = 0; i < liveCols.length; i++) xs[liveCols[i]!] = xl[i]!;
    lpRounding(s, rowsA, colsA!, xs, liveCols, cost, here);
  };
  let lastObj = cutRounds > 0 && status === "optimal" ? lp.objective() : 0;
  let stalled = 0;
  for (let round = 0; round < cutRounds && status === "optimal"; round++) {
    if (colsA) roundAt(lp);
    // The weights are integers: a bound that rounds up to the incumbent needs no more cuts.
    if (cost + Math.ceil(lastObj - 1e-6) >= s.best) break;
    const fresh = lp.gomoryCuts(s.tuning.cutsPerRound);
    if (fresh.length === 0) break;
    for (const f of fresh) {
      lpCuts.push(f);
      s.cuts.push({ cols: Int32Array.from(f.cols, (i) => liveCols[i]!), val: f.val, rhs: f.rhs });
    }
    lp.withCuts(fresh);
    status = solveAll(lp);
    if (status !== "optimal") break;
    const obj = lp.objective();
    if (obj < lastObj + 1e-3 && ++stalled > s.tuning.cutStall) break;
    lastObj = Math.max(lastObj, obj);
  }
  if (status !== "optimal") {
    lp.release();
    return status === "infeasible" ? "infeasible" : null;
  }
  if (colsA) roundAt(lp);
  const u = lp.duals();
  const lam = lp.cutDuals();
  const mu = K >= 0 ? lp.budgetDual() : 0;
  let L = -mu * Math.max(0, K);
  // The absolute size of L's terms, for a margin against rounding in these sums (weights reach 2^21 and more).
  let mag = Math.abs(L);
  for (let i = 0; i < lpRows; i++) {
    L += u[i]!;
    mag += u[i]!;
  }
  const rc = new Float64Array(core.cols.length);
  const red = new Float64Array(liveCols.length);
  for (let i = 0; i < liveCols.length; i++) {
    let v = w[i]! + mu;
    const l = lpCols[i]!;
    for (let q = 0; q < l.length; q++) v -= u[l[q]!]!;
    red[i] = v;
  }
  for (let g = 0; g < lpCuts.length; g++) {
    const lg = lam[g]!;
    if (lg === 0) continue;
    const cut = lpCuts[g]!;
    L -= lg * cut.rhs;
    mag += Math.abs(lg * cut.rhs);
    for (let k = 0; k < cut.cols.length; k++) red[cut.cols[k]!]! += lg * cut.val[k]!;
  }
  for (let i = 0; i < liveCols.length; i++) {
    rc[liveCols[i]!] = red[i]!;
    if (red[i]! < 0) {
      L += red[i]!;
      mag -= red[i]!;
    }
  }
  // Float sums of n terms err by at most about n·2^-53 of their absolute size (measured: 3e-7 at
  // L ≈ 3e8); 1e-11 of it, far above that and far below 1, keeps the bound proven before its ceiling is taken.
  L -= 1e-11 * mag + 1e-9;
  const xl = lp.primal();
  const x = new Float64Array(core.cols.length);
  for (let i = 0; i < liveCols.length; i++) x[liveCols[i]!] = xl[i]!;
  if (!root || !(L > beat)) lp.release();
  if (!(L > beat)) return null;
  return { lb: L, rc, liveCols, x, lp: root ? lp : null, solveAll };
}

/**
 * LP diving for an incumbent: columns at or near 1 (else the largest
 * fractional one) are fixed at 1 by single-column rows added to the solved
 * LP, which goes on by dual simplex from its basis; after each step the
 * solution is rounded. Stops when the LP turns integral, infeasible, or
 * its bound reaches the incumbent. The fixing rows hold only for the dive.
 */
export function dive(s: Search, start: CoverLp, liveCols: number[], solveAll: LpNode["solveAll"], rowsA: Uint32Array, colsA: Uint32Array, cost: number, here: number[]): void {
  const core = s.core;
  const lp = start;
  const n = liveCols.length;
  const fixed = new Uint8Array(n);
  for (let step = 0; step < s.tuning.diveSteps; step++) {
    const x = lp.primal();
    const fix: number[] = [];
    let top = -1;
    for (let i = 0; i < n; i++) {
      if (fixed[i]) continue;
      const v = x[i]!;
      if (v > 1 - 1e-9 || v < 1e-9) continue;
      if (v >= s.tuning.diveFixAbove) fix.push(i);
      if (top < 0 || v > x[top]!) top = i;
    }
    if (top < 0) break; // integral
    if (fix.length === 0) fix.push(top);
    for (const i of fix) fixed[i] = 1;
    lp.withCuts(fix.map((i) => ({ cols: Int32Array.of(i), val: Int32Array.of(-1), rhs: -1 })));
    if (solveAll(lp, false) !== "optimal") return;
    const xl = lp.primal();
    const xs = new Float64Array(core.cols.length);
    for (let i = 0; i < n; i++) xs[liveCols[i]!] = xl[i]!;
    lpRounding(s, rowsA, colsA, xs, liveCols, cost, here);
    if (cost + Math.ceil(lp.objective() - 1e-6) >= s.best) return;
  }
}
