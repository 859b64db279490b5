/**
 * LP relaxation of a set cover with an optional column budget, by a dense
 * bounded dual simplex:
 *
 *   min Σ w_c x_c  s.t.  Σ_{c ∋ r} x_c ≥ 1 for every row r,  Σ x_c ≤ K,  0 ≤ x_c ≤ 1.
 *
 * Starting from x = 0 every reduced cost is w_c ≥ 0, so the slack basis is
 * dual feasible and no first phase is needed.
 * The result is only used as Lagrangian multipliers:
 * the caller evaluates the Lagrangian bound at them, which is a proven bound
 * for any u ≥ 0, μ ≥ 0, so rounding in the simplex can cost tightness but
 * never soundness.
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
  /** "infeasible" only with a certificate that no point meets the rows within the budget. */
  status: "optimal" | "infeasible" | "stopped";
  iterations: number;
}

/**
 * The covering LP with a dense basis inverse. Rows: -a_r·x + t_r = -1
 * (t_r ≥ 0) and Σx + t = K; the slacks t are variables n .. n+M-1, the
 * columns 0 .. n-1 lie in [0, 1] (a nonbasic column sits at 0 or at 1).
 */
export class CoverLp {
  readonly n: number;
  readonly M: number;
  private readonly hasCard: boolean;
  private readonly card: number;
  private readonly NV: number;
  /** The simplex state: basis inverse (by rows), basis, each variable's basis row (-1 nonbasic), basic values,
   * nonbasic columns at 1, reduced costs, dual steepest-edge weights. */
  private readonly Binv: Float64Array;
  private readonly basis: Int32Array;
  private readonly pos: Int32Array;
  private readonly xB: Float64Array;
  private readonly atUpper: Uint8Array;
  private readonly d: Float64Array;
  private readonly beta: Float64Array;
  private readonly alpha: Float64Array;
  private readonly colq: Float64Array;
  private readonly rowp: Float64Array;
  private readonly nzIdx: Int32Array;
  /** Rows → columns (CSR), for the tableau row computed over B⁻¹'s nonzeros. */
  private readonly rowStart: Int32Array;
  private readonly rowCols: Int32Array;
  private readonly rowNz: Int32Array;
  private readonly seen: Int32Array;
  private readonly touched: Int32Array;
  private stamp = 0;
  iterations = 0;

  constructor(
    readonly rowCount: number,
    readonly cols: Int32Array[],
    readonly w: ArrayLike<number>,
    readonly K = -1,
  ) {
    const n = cols.length;
    this.n = n;
    this.hasCard = K >= 0;
    const M = rowCount + (this.hasCard ? 1 : 0);
    this.M = M;
    this.card = rowCount;
    this.NV = n + M;
    const Binv = new Float64Array(M * M);
    for (let i = 0; i < M; i++) Binv[i * M + i] = 1;
    const basis = new Int32Array(M);
    for (let i = 0; i < M; i++) basis[i] = n + i;
    const pos = new Int32Array(this.NV).fill(-1);
    for (let i = 0; i < M; i++) pos[n + i] = i;
    const xB = new Float64Array(M);
    for (let i = 0; i < rowCount; i++) xB[i] = -1;
    if (this.hasCard) xB[this.card] = K;
    const d = new Float64Array(this.NV);
    // A tiny spread of the costs breaks the heavy dual degeneracy of covering LPs.
    let seed = 0x9e3779b9;
    for (let c = 0; c < n; c++) {
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      d[c] = w[c]! + 1e-7 * (1 + seed / 4294967296);
    }
    this.Binv = Binv;
    this.basis = basis;
    this.pos = pos;
    this.xB = xB;
    this.atUpper = new Uint8Array(this.NV);
    this.d = d;
    this.beta = new Float64Array(M).fill(1);
    this.alpha = new Float64Array(this.NV);
    this.colq = new Float64Array(M);
    this.rowp = new Float64Array(M);
    this.nzIdx = new Int32Array(M);
    this.rowStart = new Int32Array(rowCount + 1);
    for (const l of cols) for (let k = 0; k < l.length; k++) this.rowStart[l[k]! + 1]!++;
    for (let r = 0; r < rowCount; r++) this.rowStart[r + 1]! += this.rowStart[r]!;
    this.rowCols = new Int32Array(this.rowStart[rowCount]!);
    const fill = this.rowStart.slice(0, rowCount);
    for (let c = 0; c < n; c++) for (const r of cols[c]!) this.rowCols[fill[r]!++] = c;
    this.rowNz = new Int32Array(M);
    this.seen = new Int32Array(n);
    this.touched = new Int32Array(this.NV);
  }

  private value(j: number): number {
    if (this.pos[j]! >= 0) return this.xB[this.pos[j]!]!;
    if (j >= this.n) return 0;
    return this.atUpper[j]!;
  }

  /**
   * Dual simplex from the current basis. Stops after `maxIters` pivots or at
   * `deadline` ("stopped"); "infeasible" only with a certificate (see
   * {@link certifiedInfeasible}).
   */
  solve(deadline = Infinity, maxIters = 50 * (this.M + 1)): "optimal" | "infeasible" | "stopped" {
    const { Binv, basis, pos, xB, atUpper, d, beta } = this;
    const { n, M, alpha, colq, rowp, nzIdx, cols, rowStart, rowCols, rowNz, seen, touched, rowCount } = this;
    const hasCard = this.hasCard;
    const card = this.card;
    const tolP = 1e-9;
    const tolPiv = 1e-9;
    for (let it = 0; it < maxIters; it++, this.iterations++) {
      if ((it & 31) === 31 && Date.now() > deadline) return "stopped";
      // Leaving row: dual steepest edge, the largest violation² over the squared norm of its B⁻¹ row.
      let p = -1;
      let worst = 0;
      let below = true;
      for (let i = 0; i < M; i++) {
        const v = xB[i]!;
        const b = basis[i]!;
        if (-v > tolP) {
          const e = -v;
          const score = (e * e) / beta[i]!;
          if (score > worst) {
            worst = score;
            p = i;
            below = true;
          }
        } else if (b < n) {
          const e = v - 1;
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
      if (p < 0) return "optimal";
      // Tableau row over the nonbasic variables that may move, row-wise over the nonzeros of B⁻¹'s row p
      // (a column's entry is the budget entry less the row entries it covers), and the dual ratio test.
      let nzp = 0;
      for (let k = 0; k < M; k++) {
        const v = Binv[p * M + k]!;
        rowp[k] = v;
        if (v !== 0) rowNz[nzp++] = k;
      }
      const st = ++this.stamp;
      let nt = 0;
      for (let t = 0; t < nzp; t++) {
        const k = rowNz[t]!;
        if (k >= rowCount) continue;
        const v = rowp[k]!;
        for (let e = rowStart[k]!; e < rowStart[k + 1]!; e++) {
          const j = rowCols[e]!;
          if (seen[j] !== st) {
            seen[j] = st;
            alpha[j] = 0;
            touched[nt++] = j;
          }
          alpha[j]! -= v;
        }
      }
      const base = hasCard ? rowp[card]! : 0;
      if (base !== 0) {
        nt = 0;
        for (let j = 0; j < n; j++) {
          alpha[j] = seen[j] === st ? alpha[j]! + base : base;
          touched[nt++] = j;
        }
      }
      for (let t = 0; t < nzp; t++) {
        const j = n + rowNz[t]!;
        alpha[j] = rowp[rowNz[t]!]!;
        touched[nt++] = j;
      }
      let q = -1;
      let bestRatio = Infinity;
      let bestAbs = 0;
      for (let t = 0; t < nt; t++) {
        const j = touched[t]!;
        if (pos[j]! >= 0) continue;
        const a = alpha[j]!;
        const atUp = atUpper[j] === 1;
        // Below lower: the row rises when a variable at lower with a < 0 grows or one at upper with a > 0 shrinks.
        const eligible = below ? (atUp ? a > tolPiv : a < -tolPiv) : atUp ? a < -tolPiv : a > tolPiv;
        if (!eligible) continue;
        const abs = Math.abs(a);
        const ratio = Math.abs(d[j]!) / abs;
        if (ratio < bestRatio - 1e-12 || (ratio <= bestRatio + 1e-12 && abs > bestAbs)) {
          bestRatio = ratio;
          bestAbs = abs;
          q = j;
        }
      }
      if (q < 0) return this.certifiedInfeasible(p) ? "infeasible" : "stopped";
      // Entering column B⁻¹ a_q.
      if (q < n) {
        const l = cols[q]!;
        for (let i = 0; i < M; i++) {
          const row = i * M;
          let sum = hasCard ? Binv[row + card]! : 0;
          for (let k = 0; k < l.length; k++) sum -= Binv[row + l[k]!]!;
          colq[i] = sum;
        }
      } else {
        for (let i = 0; i < M; i++) colq[i] = Binv[i * M + (q - n)]!;
      }
      const apq = colq[p]!;
      if (Math.abs(apq) < tolPiv) return "stopped"; // the row and column disagree numerically
      const thetaD = d[q]! / apq;
      for (let t = 0; t < nt; t++) {
        const j = touched[t]!;
        if (pos[j]! < 0) d[j]! -= thetaD * alpha[j]!;
      }
      const leave = basis[p]!;
      d[q] = 0;
      d[leave] = -thetaD;
      const target = below ? 0 : 1;
      const thetaP = (xB[p]! - target) / apq;
      const xq = q < n ? atUpper[q]! : 0;
      for (let i = 0; i < M; i++) xB[i]! -= thetaP * colq[i]!;
      xB[p] = xq + thetaP;
      atUpper[leave] = below ? 0 : 1;
      atUpper[q] = 0;
      basis[p] = q;
      pos[q] = p;
      pos[leave] = -1;
      // B⁻¹ ← E B⁻¹. The pivot row of B⁻¹ stays sparse for a long time: update over its nonzeros only.
      // The row norms follow exactly: |r_i − f r_p|² = β_i − 2f (r_i·r_p) + f² β_p.
      const prow = p * M;
      const inv = 1 / apq;
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
    return "stopped";
  }

  /**
   * Whether row p of B⁻¹ proves the LP infeasible (a Farkas certificate):
   * with y that row, every point satisfies Σ_j (yᵀA_j)·x_j + Σ_i y_i·t_i = yᵀb.
   * Over the box every feasible point lies in (columns in [0, 1], a row's
   * surplus in [0, its columns − 1], the budget's in [0, K]) the left side's
   * range is computed from the problem's own data, not from the basis; when
   * yᵀb lies outside it by more than a rounding margin, no point exists. Any
   * y makes a valid certificate, so errors in B⁻¹ can only lose one.
   */
  private certifiedInfeasible(p: number): boolean {
    const { Binv } = this;
    const { n, M, cols, rowCount, rowStart } = this;
    const y = (k: number) => Binv[p * M + k]!;
    const yCard = this.hasCard ? y(this.card) : 0;
    let rhs = this.hasCard ? yCard * this.K : 0;
    for (let r = 0; r < rowCount; r++) rhs -= y(r);
    let lo = 0;
    let hi = 0;
    let scale = Math.abs(rhs);
    const add = (a: number, range: number) => {
      if (a > 0) hi += a * range;
      else lo += a * range;
      scale += Math.abs(a) * range;
    };
    for (let j = 0; j < n; j++) {
      let a = yCard;
      const l = cols[j]!;
      for (let k = 0; k < l.length; k++) a -= y(l[k]!);
      add(a, 1);
    }
    for (let r = 0; r < rowCount; r++) add(y(r), Math.max(0, rowStart[r + 1]! - rowStart[r]! - 1));
    if (this.hasCard) add(yCard, this.K);
    const margin = 1e-7 * (1 + scale);
    return rhs > hi + margin || rhs < lo - margin;
  }

  /** Row duals u_r ≥ 0 from the slacks' reduced costs. */
  duals(u: Float64Array = new Float64Array(this.rowCount)): Float64Array {
    const { pos, d } = this;
    for (let i = 0; i < this.rowCount; i++) u[i] = pos[this.n + i]! >= 0 ? 0 : Math.max(0, d[this.n + i]!);
    return u;
  }

  /** Budget dual μ ≥ 0 (0 without a budget). */
  budgetDual(): number {
    const { pos, d } = this;
    return this.hasCard && pos[this.n + this.card]! < 0 ? Math.max(0, d[this.n + this.card]!) : 0;
  }

  /** Primal column values of the current basis. */
  primal(x: Float64Array = new Float64Array(this.n)): Float64Array {
    for (let c = 0; c < this.n; c++) x[c] = this.value(c);
    return x;
  }
}

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
