/**
 * The covering LP (lib/minimize/lp): a bounded dual simplex (./simplex), its
 * Chvátal–Gomory cuts (./cuts), infeasibility certificates
 * (./certificate), the pool its basis inverses come from (./pool), and the
 * Lagrangian bound at any multipliers.
 */
import { CoverLp, type CoverLpResult } from "./simplex";

export { CoverLp, type CoverLpResult, type LpCut } from "./simplex";
export { BufferPool } from "./pool";

/**
 * Duals of the LP relaxation. `cols[c]` lists the rows column c covers
 * (0 ≤ r < rowCount), `w[c]` ≥ 0 its weight; `K` < 0 means no budget.
 * Stops after `maxIters` pivots (default 50 × rows) or at `deadline`
 * (Date.now() milliseconds), returning the duals reached so far.
 */
export function coverLpDuals(rowCount: number, cols: Int32Array[], w: ArrayLike<number>, K = -1, deadline = Infinity, maxIters = 50 * (rowCount + 1)): CoverLpResult {
  const lp = new CoverLp(rowCount, cols, w, K);
  const status = lp.solve(deadline, maxIters);
  return { u: lp.duals(), mu: lp.budgetDual(), x: lp.primal(), optimal: status === "optimal", status, iterations: lp.iterations };
}

/**
 * Lagrangian bound Σu − μK + Σ_c min(0, w_c + μ − Σ_{r ∈ c} u_r): a proven
 * lower bound on every cover of at most K columns (K < 0: no budget, μ
 * ignored) for any u ≥ 0, μ ≥ 0.
 */
export function lagrangianValue(cols: ArrayLike<number>[], w: ArrayLike<number>, u: ArrayLike<number>, mu: number, K = -1): number {
  let L = 0;
  for (let r = 0; r < u.length; r++) L += Math.max(0, u[r]!);
  const m = K >= 0 ? Math.max(0, mu) : 0;
  if (K >= 0) L -= m * K;
  for (let c = 0; c < cols.length; c++) {
    let s = w[c]! + m;
    const l = cols[c]!;
    for (let k = 0; k < l.length; k++) s -= Math.max(0, u[l[k]!]!);
    if (s < 0) L += s;
  }
  return L;
}
