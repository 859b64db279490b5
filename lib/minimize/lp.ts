/**
 * LP relaxation of a set cover with an optional column budget, by a dense
 * bounded dual simplex:
 *
 *   min Σ w_c x_c  s.t.  Σ_{c ∋ r} x_c ≥ 1 for every row r,  Σ x_c ≤ K,  0 ≤ x_c ≤ 1.
 *
 * Starting from x = 0 every reduced cost is w_c ≥ 0, so the slack basis is
 * dual feasible and no first phase is needed. The result is only used as
 * Lagrangian multipliers: the caller evaluates the Lagrangian bound at them,
 * which is a proven bound for any u ≥ 0, μ ≥ 0, so rounding in the simplex
 * can cost tightness but never soundness.
 */

export interface CoverLpResult {
  /** Row multipliers u_r ≥ 0 (one per row of the problem). */
  u: Float64Array;
  /** Budget multiplier μ ≥ 0 (0 without a budget). */
  mu: number;
  /** Primal values x_c of the final basis (an optimal LP solution when `optimal`). */
  x: Float64Array;
  /** True when the simplex ended primal and dual feasible (an optimal basis). */
  optimal: boolean;
  iterations: number;
}

/**
 * Duals of the LP relaxation. `cols[c]` lists the rows column c covers
 * (0 ≤ r < rowCount), `w[c]` ≥ 0 its weight; `K` < 0 means no budget.
 * Stops after `maxIters` pivots (default 50 × rows) or at `deadline`
 * (Date.now() milliseconds), returning the duals reached so far.
 */
export function coverLpDuals(rowCount: number, cols: Int32Array[], w: ArrayLike<number>, K = -1, deadline = Infinity, maxIters = 50 * (rowCount + 1)): CoverLpResult {
  const n = cols.length;
  const hasCard = K >= 0;
  const M = rowCount + (hasCard ? 1 : 0);
  const card = rowCount;
  const NV = n + M;
  // Rows: -a_r·x + t_r = -1 (t_r ≥ 0) and Σx + t = K; slacks t are variables n .. n+M-1.
  const Binv = new Float64Array(M * M);
  for (let i = 0; i < M; i++) Binv[i * M + i] = 1;
  const basis = new Int32Array(M);
  for (let i = 0; i < M; i++) basis[i] = n + i;
  const pos = new Int32Array(NV).fill(-1);
  for (let i = 0; i < M; i++) pos[n + i] = i;
  const xB = new Float64Array(M);
  for (let i = 0; i < rowCount; i++) xB[i] = -1;
  if (hasCard) xB[card] = K;
  const atUpper = new Uint8Array(NV);
  const d = new Float64Array(NV);
  // A tiny spread of the costs breaks the heavy dual degeneracy of covering LPs.
  let seed = 0x9e3779b9;
  for (let c = 0; c < n; c++) {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    d[c] = w[c]! + 1e-7 * (1 + seed / 4294967296);
  }
  const upper = (v: number) => (v < n ? 1 : Infinity);
  const alpha = new Float64Array(NV);
  const colq = new Float64Array(M);
  const rowp = new Float64Array(M);
  const nzIdx = new Int32Array(M);
  const beta = new Float64Array(M).fill(1);
  const tolP = 1e-9;
  const tolPiv = 1e-9;
  let optimal = false;
  let it = 0;
  for (; it < maxIters; it++) {
    if ((it & 31) === 31 && Date.now() > deadline) break;
    // Leaving row: dual steepest edge, the largest violation² over the squared norm of its B⁻¹ row.
    let p = -1;
    let worst = 0;
    let below = true;
    for (let i = 0; i < M; i++) {
      const v = xB[i]!;
      if (-v > tolP) {
        const score = (v * v) / beta[i]!;
        if (score > worst) {
          worst = score;
          p = i;
          below = true;
        }
      } else {
        const e = v - upper(basis[i]!);
        if (e > tolP) {
          const score = (e * e) / beta[i]!;
          if (score > worst) {
            worst = score;
            p = i;
            below = false;
          }
        }
      }
    }
    if (p < 0) {
      optimal = true;
      break;
    }
    for (let k = 0; k < M; k++) rowp[k] = Binv[p * M + k]!;
    // Tableau row over the nonbasic variables, and the dual ratio test.
    let q = -1;
    let bestRatio = Infinity;
    let bestAbs = 0;
    for (let j = 0; j < NV; j++) {
      if (pos[j]! >= 0) continue;
      let a: number;
      if (j < n) {
        a = hasCard ? rowp[card]! : 0;
        const l = cols[j]!;
        for (let k = 0; k < l.length; k++) a -= rowp[l[k]!]!;
      } else a = rowp[j - n]!;
      alpha[j] = a;
      const up = atUpper[j] === 1;
      // Below lower: the row rises when a variable at lower with a < 0 grows or one at upper with a > 0 shrinks.
      const eligible = below ? (up ? a > tolPiv : a < -tolPiv) : up ? a < -tolPiv : a > tolPiv;
      if (!eligible) continue;
      const abs = Math.abs(a);
      const ratio = Math.abs(d[j]!) / abs;
      if (ratio < bestRatio - 1e-12 || (ratio <= bestRatio + 1e-12 && abs > bestAbs)) {
        bestRatio = ratio;
        bestAbs = abs;
        q = j;
      }
    }
    if (q < 0) break; // dual unbounded: the LP has no feasible point (a budget too small)
    // Entering column B⁻¹ a_q.
    if (q < n) {
      const l = cols[q]!;
      for (let i = 0; i < M; i++) {
        const row = i * M;
        let s = hasCard ? Binv[row + card]! : 0;
        for (let k = 0; k < l.length; k++) s -= Binv[row + l[k]!]!;
        colq[i] = s;
      }
    } else {
      for (let i = 0; i < M; i++) colq[i] = Binv[i * M + (q - n)]!;
    }
    const apq = colq[p]!;
    if (Math.abs(apq) < tolPiv) break; // the row and column disagree numerically: stop with the duals so far
    const thetaD = d[q]! / apq;
    for (let j = 0; j < NV; j++) if (pos[j]! < 0) d[j]! -= thetaD * alpha[j]!;
    const leave = basis[p]!;
    d[q] = 0;
    d[leave] = -thetaD;
    const target = below ? 0 : upper(leave);
    const thetaP = (xB[p]! - target) / apq;
    const xq = atUpper[q] ? 1 : 0;
    for (let i = 0; i < M; i++) xB[i]! -= thetaP * colq[i]!;
    xB[p] = xq + thetaP;
    atUpper[leave] = below ? 0 : 1;
    atUpper[q] = 0;
    basis[p] = q;
    pos[q] = p;
    pos[leave] = -1;
    // B⁻¹ ← E B⁻¹.
    const prow = p * M;
    const inv = 1 / apq;
    // The pivot row of B⁻¹ stays sparse for a long time: update over its nonzeros only.
    // The row norms follow exactly: |r_i − f r_p|² = β_i − 2f (r_i·r_p) + f² β_p.
    let nz = 0;
    let bp = 0;
    for (let k = 0; k < M; k++) {
      const v = Binv[prow + k]!;
      if (v !== 0) {
        const s2 = v * inv;
        Binv[prow + k] = s2;
        bp += s2 * s2;
        nzIdx[nz++] = k;
      }
    }
    beta[p] = bp;
    for (let i = 0; i < M; i++) {
      if (i === p) continue;
      const f = colq[i]!;
      if (f === 0) continue;
      const row = i * M;
      let dot = 0;
      for (let t = 0; t < nz; t++) {
        const k = nzIdx[t]!;
        const pk = Binv[prow + k]!;
        const v = Binv[row + k]!;
        dot += v * pk;
        Binv[row + k] = v - f * pk;
      }
      const b = beta[i]! - 2 * f * dot + f * f * bp;
      beta[i] = b > 1e-12 ? b : 1e-12;
    }
  }
  // Duals from the slacks' reduced costs: d(t_r) = u_r, d(t) = μ.
  const u = new Float64Array(rowCount);
  for (let i = 0; i < rowCount; i++) u[i] = pos[n + i]! >= 0 ? 0 : Math.max(0, d[n + i]!);
  const mu = hasCard && pos[n + card]! < 0 ? Math.max(0, d[n + card]!) : 0;
  const x = new Float64Array(n);
  for (let c = 0; c < n; c++) x[c] = pos[c]! >= 0 ? xB[pos[c]!]! : atUpper[c]!;
  return { u, mu, x, optimal, iterations: it };
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
