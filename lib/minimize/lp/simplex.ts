/**
 * LP relaxation of a set cover with an optional column budget, by a dense
 * bounded dual simplex:
 *
 *   min Σ w_c x_c  s.t.  Σ_{c ∋ r} x_c ≥ 1 for every row r,  Σ x_c ≤ K,  0 ≤ x_c ≤ 1.
 *
 * plus rows Σ val·x ≤ rhs with integer data (cuts, and covering rows added
 * later by the caller). Starting from x = 0 every reduced cost is w_c ≥ 0, so
 * the slack basis is dual feasible and no first phase is needed.
 * The duals are only used as Lagrangian multipliers: the caller evaluates the
 * Lagrangian bound at them, which is a proven bound for any multipliers ≥ 0,
 * so rounding in the simplex can cost tightness but never soundness. The same
 * holds for the cuts built from the tableau (./cuts) and for the
 * infeasibility certificate (./certificate), both computed from the
 * problem's data.
 */
import { certifiedInfeasible } from "./certificate";
import { gomoryCuts as cutsFromTableau } from "./cuts";
import type { BufferPool } from "./pool";

/** A row Σ val_k · x_{cols_k} ≤ rhs with integer coefficients: a Chvátal–Gomory cut, a covering row added later, or a dive's fixing row. */
export interface LpCut {
  cols: Int32Array;
  val: Int32Array;
  rhs: number;
}

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
 * (t_r ≥ 0), Σx + t = K, and cut rows g·x + t_g = rhs_g; the slacks t are
 * variables n .. n+M-1, the columns 0 .. n-1 lie in [0, 1] (a nonbasic
 * column sits at 0 or at 1). Every row has integer coefficients and an
 * integer right-hand side, so every slack of an integer point is an integer.
 */
export class CoverLp {
  // The simplex state below is read by ./cuts and ./certificate; outside lp/ only the methods are used.
  readonly n: number;
  /** Rows now (covering rows, the budget, cuts); grows as cuts are added. */
  M: number;
  /** Room for rows: the stride of B⁻¹'s rows and the length of the per-row arrays. */
  S: number;
  readonly hasCard: boolean;
  readonly card: number;
  /** Index of the first cut row. */
  readonly cutBase: number;
  readonly cutList: LpCut[];
  /** Columns → cut rows (CSR): the cut rows of column j are colCutRow[colCutStart[j] ..), coefficients colCutVal. */
  colCutStart = new Int32Array(0);
  colCutRow = new Int32Array(0);
  colCutVal = new Int32Array(0);
  cutAt = new Int32Array(0);
  /** The simplex state: basis inverse (by rows, stride S), basis, each variable's basis row (-1 nonbasic), basic values,
   * nonbasic columns at 1, reduced costs, dual steepest-edge weights. */
  Binv: Float64Array;
  basis: Int32Array;
  pos: Int32Array;
  xB: Float64Array;
  atUpper: Uint8Array;
  d: Float64Array;
  beta: Float64Array;
  alpha: Float64Array;
  colq: Float64Array;
  rowp: Float64Array;
  nzIdx: Int32Array;
  /** Rows → columns (CSR), for the tableau row computed over B⁻¹'s nonzeros. */
  readonly rowStart: Int32Array;
  readonly rowCols: Int32Array;
  rowNz: Int32Array;
  /**
   * For each column k of B⁻¹, a superset of its nonzero rows (bitset, W words a column; bits only ever set
   * between rebuilds): the entering column B⁻¹a_q is computed over the union of its columns' sets only
   * (B⁻¹ a_q is 6–13 % nonzero on the random 10-input bench cases). `colNzRows` lists the entering
   * column's nonzero rows, `pivotRows` is the bitset of the rows a pivot changes, `union` scratch.
   */
  colMask: Uint32Array;
  W: number;
  union: Uint32Array;
  pivotRows: Uint32Array;
  colNzRows: Int32Array;
  readonly seen: Int32Array;
  touched: Int32Array;
  stamp = 0;
  iterations = 0;

  constructor(
    readonly rowCount: number,
    readonly cols: Int32Array[],
    readonly w: ArrayLike<number>,
    readonly K = -1,
    cuts: readonly LpCut[] = [],
    /** Room for this many more rows (cuts added later by {@link withCuts} without a new allocation). */
    spare = 0,
    /** Where B⁻¹ comes from and goes back to on {@link release}; without one, each LP allocates its own. */
    private readonly pool: BufferPool | null = null,
  ) {
    // A copy: the caller's list may grow.
    this.cutList = cuts.slice();
    const n = cols.length;
    this.n = n;
    this.hasCard = K >= 0;
    this.cutBase = rowCount + (this.hasCard ? 1 : 0);
    const M = this.cutBase + cuts.length;
    this.M = M;
    const S = M + Math.max(0, spare);
    this.S = S;
    this.card = rowCount;
    this.indexCuts();
    const NV = n + S;
    // Only the rows in use are cleared: a row added later is written whole (see withCuts).
    const Binv = pool ? pool.take(S * S, M * S) : new Float64Array(S * S);
    for (let i = 0; i < M; i++) Binv[i * S + i] = 1;
    const W = (S + 31) >>> 5;
    this.W = W;
    this.colMask = new Uint32Array(S * W);
    for (let k = 0; k < M; k++) this.colMask[k * W + (k >>> 5)] = 1 << (k & 31);
    this.union = new Uint32Array(W);
    this.pivotRows = new Uint32Array(W);
    this.colNzRows = new Int32Array(S);
    const basis = new Int32Array(S);
    for (let i = 0; i < M; i++) basis[i] = n + i;
    const pos = new Int32Array(NV).fill(-1);
    for (let i = 0; i < M; i++) pos[n + i] = i;
    const xB = new Float64Array(S);
    for (let i = 0; i < rowCount; i++) xB[i] = -1;
    if (this.hasCard) xB[this.card] = K;
    cuts.forEach((cut, g) => (xB[this.cutBase + g] = cut.rhs));
    const d = new Float64Array(NV);
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
    this.atUpper = new Uint8Array(NV);
    this.d = d;
    this.beta = new Float64Array(S).fill(1);
    this.alpha = new Float64Array(NV);
    this.colq = new Float64Array(S);
    this.rowp = new Float64Array(S);
    this.nzIdx = new Int32Array(S);
    this.rowStart = new Int32Array(rowCount + 1);
    for (const l of cols) for (let k = 0; k < l.length; k++) this.rowStart[l[k]! + 1]!++;
    for (let r = 0; r < rowCount; r++) this.rowStart[r + 1]! += this.rowStart[r]!;
    this.rowCols = new Int32Array(this.rowStart[rowCount]!);
    const fill = this.rowStart.slice(0, rowCount);
    for (let c = 0; c < n; c++) for (const r of cols[c]!) this.rowCols[fill[r]!++] = c;
    this.rowNz = new Int32Array(S);
    this.seen = new Int32Array(n);
    this.touched = new Int32Array(NV);
  }

  /** Hands the basis inverse back for reuse by a later LP; this LP must not be used after. */
  release(): void {
    this.pool?.give(this.Binv);
    this.Binv = new Float64Array(0);
    this.M = 0;
  }

  /** The cut rows, in row order. */
  get cuts(): readonly LpCut[] {
    return this.cutList;
  }

  /** Columns → cut rows, from the cut list (rebuilt as cuts are added, into the same arrays while they fit). */
  private indexCuts(): void {
    const n = this.n;
    let start = this.colCutStart;
    if (start.length !== n + 1) start = new Int32Array(n + 1);
    else start.fill(0);
    for (const cut of this.cutList) for (let k = 0; k < cut.cols.length; k++) start[cut.cols[k]! + 1]!++;
    for (let j = 0; j < n; j++) start[j + 1]! += start[j]!;
    const total = start[n]!;
    let row = this.colCutRow;
    let val = this.colCutVal;
    if (row.length < total) {
      row = new Int32Array(2 * total);
      val = new Int32Array(2 * total);
    }
    if (this.cutAt.length !== n) this.cutAt = new Int32Array(n);
    const at = this.cutAt;
    at.set(start.subarray(0, n));
    this.cutList.forEach((cut, g) => {
      for (let k = 0; k < cut.cols.length; k++) {
        const j = cut.cols[k]!;
        row[at[j]!] = this.cutBase + g;
        val[at[j]!++] = cut.val[k]!;
      }
    });
    this.colCutStart = start;
    this.colCutRow = row;
    this.colCutVal = val;
  }

  private value(j: number): number {
    if (this.pos[j]! >= 0) return this.xB[this.pos[j]!]!;
    if (j >= this.n) return 0;
    return this.atUpper[j]!;
  }

  /**
   * Dual simplex from the current basis. Stops after `maxIters` pivots or at
   * `deadline` ("stopped"); "infeasible" only with a certificate (see
   * ./certificate).
   */
  solve(deadline = Infinity, maxIters = 50 * (this.M + 1)): "optimal" | "infeasible" | "stopped" {
    const { Binv, basis, pos, xB, atUpper, d, beta } = this;
    const { n, M, S, alpha, colq, rowp, nzIdx, cols, rowStart, rowCols, rowNz, seen, touched, rowCount, cutBase, colCutStart } = this;
    const { W, colMask, union, pivotRows, colNzRows } = this;
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
        const v = Binv[p * S + k]!;
        rowp[k] = v;
        if (v !== 0) rowNz[nzp++] = k;
      }
      const st = ++this.stamp;
      let nt = 0;
      for (let t = 0; t < nzp; t++) {
        const k = rowNz[t]!;
        const v = rowp[k]!;
        if (k < rowCount) {
          for (let e = rowStart[k]!; e < rowStart[k + 1]!; e++) {
            const j = rowCols[e]!;
            if (seen[j] !== st) {
              seen[j] = st;
              alpha[j] = 0;
              touched[nt++] = j;
            }
            alpha[j]! -= v;
          }
        } else if (k >= cutBase) nt = this.cutRowIntoAlpha(k, v, st, nt);
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
      if (q < 0) return certifiedInfeasible(this, p) ? "infeasible" : "stopped";
      // Entering column B⁻¹ a_q, over the rows where one of a_q's columns of B⁻¹ may be nonzero (elsewhere
      // every term is 0, and so is the entry); nc of them end nonzero, listed in colNzRows.
      colq.fill(0, 0, M);
      union.fill(0);
      const c0 = q < n ? colCutStart[q]! : 0;
      const c1 = q < n ? colCutStart[q + 1]! : 0;
      if (q < n) {
        const l = cols[q]!;
        if (hasCard) for (let w = 0, at = card * W; w < W; w++) union[w]! |= colMask[at + w]!;
        for (let k = 0; k < l.length; k++) for (let w = 0, at = l[k]! * W; w < W; w++) union[w]! |= colMask[at + w]!;
        for (let e = c0; e < c1; e++) for (let w = 0, at = this.colCutRow[e]! * W; w < W; w++) union[w]! |= colMask[at + w]!;
      } else for (let w = 0, at = (q - n) * W; w < W; w++) union[w] = colMask[at + w]!;
      let nc = 0;
      for (let w = 0; w < W; w++) {
        for (let x = union[w]!; x !== 0; x &= x - 1) {
          const i = (w << 5) | (31 - Math.clz32(x & -x));
          const row = i * S;
          let sum: number;
          if (q < n) {
            const l = cols[q]!;
            sum = hasCard ? Binv[row + card]! : 0;
            for (let k = 0; k < l.length; k++) sum -= Binv[row + l[k]!]!;
            if (c1 > c0) sum += this.cutEntriesOfRow(row, c0, c1);
          } else sum = Binv[row + (q - n)]!;
          colq[i] = sum;
          if (sum !== 0) colNzRows[nc++] = i;
        }
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
      for (let t = 0; t < nc; t++) {
        const i = colNzRows[t]!;
        xB[i]! -= thetaP * colq[i]!;
      }
      xB[p] = xq + thetaP;
      atUpper[leave] = below ? 0 : 1;
      atUpper[q] = 0;
      basis[p] = q;
      pos[q] = p;
      pos[leave] = -1;
      // B⁻¹ ← E B⁻¹. The pivot row of B⁻¹ stays sparse for a long time: update over its nonzeros only.
      // Entries and multipliers that are rounding noise (below 1e-13) are dropped, which keeps B⁻¹ as
      // sparse as it really is; the bounds and cuts are computed from the problem's data, so this can only cost tightness.
      // The row norms follow exactly: |r_i − f r_p|² = β_i − 2f (r_i·r_p) + f² β_p.
      // Row p's nonzeros are rowNz (B⁻¹ has not changed since it was read): the other entries are 0 already.
      const prow = p * S;
      const inv = 1 / apq;
      let nz = 0;
      let bp = 0;
      for (let t = 0; t < nzp; t++) {
        const k = rowNz[t]!;
        const v = Binv[prow + k]!;
        if (v > 1e-13 || v < -1e-13) {
          const s2 = v * inv;
          Binv[prow + k] = s2;
          bp += s2 * s2;
          nzIdx[nz++] = k;
        } else Binv[prow + k] = 0;
      }
      beta[p] = bp;
      pivotRows.fill(0);
      for (let t = 0; t < nc; t++) {
        const i = colNzRows[t]!;
        if (i === p) continue;
        const f = colq[i]!;
        if (f < 1e-13 && f > -1e-13) continue;
        pivotRows[i >>> 5]! |= 1 << (i & 31);
        const row = i * S;
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
      // The changed rows are nonzero at most in the pivot row's columns.
      for (let t = 0; t < nz; t++) for (let w = 0, at = nzIdx[t]! * W; w < W; w++) colMask[at + w]! |= pivotRows[w]!;
    }
    return "stopped";
  }

  /**
   * Cut row k's part of the tableau row (v = B⁻¹[p, k]), marking the columns it touches; returns the
   * new count of touched columns. Apart from the simplex loop, which stays lean for the LPs without cuts.
   */
  private cutRowIntoAlpha(k: number, v: number, st: number, nt: number): number {
    const { alpha, seen, touched } = this;
    const cut = this.cutList[k - this.cutBase]!;
    for (let e = 0; e < cut.cols.length; e++) {
      const j = cut.cols[e]!;
      if (seen[j] !== st) {
        seen[j] = st;
        alpha[j] = 0;
        touched[nt++] = j;
      }
      alpha[j]! += v * cut.val[e]!;
    }
    return nt;
  }

  /** Row `row` of B⁻¹ (its offset) times the entering column's cut entries c0 .. c1 (summed in that order). */
  private cutEntriesOfRow(row: number, c0: number, c1: number): number {
    const { Binv, colCutRow, colCutVal } = this;
    let sum = 0;
    for (let e = c0; e < c1; e++) sum += colCutVal[e]! * Binv[row + colCutRow[e]!]!;
    return sum;
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

  /**
   * The LP with `fresh` cuts appended, warm-started at this basis: each new
   * row's slack joins the basis (B⁻¹'s new row is −g_B B⁻¹, g_B the cut's
   * coefficients of the basic variables, with a 1 for the
   * slack), so the reduced costs stay dual feasible and the dual simplex goes
   * on from here. In place; returns this LP.
   */
  withCuts(fresh: readonly LpCut[]): CoverLp {
    if (this.M + fresh.length > this.S) this.grow(this.M + fresh.length + Math.max(16, this.S >> 3));
    const { n, S, Binv, pos } = this;
    const M = this.M;
    const x = this.primal();
    // The basis rows of the cut's basic columns, in basis order, with their coefficients (in rowp, the
    // simplex's scratch row, free between solves; only the entries listed in basicRow are read).
    const basicRow: number[] = [];
    const basicCoef = this.rowp;
    fresh.forEach((cut, g) => {
      const i = M + g;
      const row = i * S;
      Binv.fill(0, row, row + S);
      let lhs = 0;
      basicRow.length = 0;
      for (let k = 0; k < cut.cols.length; k++) {
        const j = cut.cols[k]!;
        lhs += cut.val[k]! * x[j]!;
        const at = pos[j]!;
        if (at >= 0 && cut.val[k] !== 0) {
          basicRow.push(at);
          basicCoef[at] = cut.val[k]!;
        }
      }
      basicRow.sort((a, b) => a - b);
      for (const k of basicRow) {
        const f = basicCoef[k]!;
        const src = k * S;
        for (let q = 0; q < M; q++) Binv[row + q]! -= f * Binv[src + q]!;
      }
      // The row's squared norm (entries M .. i-1 are 0, entry i is 1), and its nonzeros into the column sets;
      // column i is e_i.
      const { W, colMask } = this;
      let b = 0;
      for (let q = 0; q < M; q++) {
        const v = Binv[row + q]!;
        if (v !== 0) {
          b += v ** 2;
          colMask[q * W + (i >>> 5)]! |= 1 << (i & 31);
        }
      }
      Binv[row + i] = 1;
      b += 1;
      this.beta[i] = b;
      colMask.fill(0, i * W, (i + 1) * W);
      colMask[i * W + (i >>> 5)] = 1 << (i & 31);
      this.basis[i] = n + i;
      this.pos[n + i] = i;
      this.xB[i] = cut.rhs - lhs;
      this.d[n + i] = 0;
      this.atUpper[n + i] = 0;
      this.cutList.push(cut);
    });
    this.M = M + fresh.length;
    this.indexCuts();
    return this;
  }

  /** Room for `S2` rows: the per-row arrays and B⁻¹ (at the new stride) are copied into larger ones. */
  private grow(S2: number): void {
    const { n, S, M } = this;
    const Binv = this.pool ? this.pool.take(S2 * S2) : new Float64Array(S2 * S2);
    for (let i = 0; i < M; i++) Binv.set(this.Binv.subarray(i * S, i * S + M), i * S2);
    this.pool?.give(this.Binv);
    this.Binv = Binv;
    const more = <T extends Float64Array | Int32Array | Uint8Array>(a: T, len: number): T => {
      const b = new (a.constructor as { new (len: number): T })(len);
      b.set(a);
      return b;
    };
    this.basis = more(this.basis, S2);
    this.xB = more(this.xB, S2);
    this.beta = more(this.beta, S2);
    this.colq = new Float64Array(S2);
    this.rowp = new Float64Array(S2);
    this.nzIdx = new Int32Array(S2);
    this.rowNz = new Int32Array(S2);
    const W2 = (S2 + 31) >>> 5;
    const colMask = new Uint32Array(S2 * W2);
    for (let k = 0; k < M; k++) colMask.set(this.colMask.subarray(k * this.W, (k + 1) * this.W), k * W2);
    this.colMask = colMask;
    this.W = W2;
    this.union = new Uint32Array(W2);
    this.pivotRows = new Uint32Array(W2);
    this.colNzRows = new Int32Array(S2);
    // Variables: the columns, then one slack per row.
    const pos = new Int32Array(n + S2).fill(-1);
    pos.set(this.pos.subarray(0, n + S));
    this.pos = pos;
    this.atUpper = more(this.atUpper, n + S2);
    this.d = more(this.d, n + S2);
    this.alpha = new Float64Array(n + S2);
    this.touched = new Int32Array(n + S2);
    this.S = S2;
  }

  /** Σ w·x at the current basis (the weights as given, without the tie-breaking spread). */
  objective(): number {
    let o = 0;
    for (let c = 0; c < this.n; c++) o += this.w[c]! * this.value(c);
    return o;
  }

  /** Cut duals λ_g ≥ 0, one per cut row. */
  cutDuals(): Float64Array {
    const { pos, d } = this;
    const out = new Float64Array(this.cuts.length);
    for (let g = 0; g < out.length; g++) {
      const j = this.n + this.cutBase + g;
      out[g] = pos[j]! >= 0 ? 0 : Math.max(0, d[j]!);
    }
    return out;
  }

  /** Chvátal–Gomory cuts of the optimal tableau (see ./cuts). */
  gomoryCuts(max: number, minViolation = 0.05): LpCut[] {
    return cutsFromTableau(this, max, minViolation);
  }

  /** Primal column values of the current basis. */
  primal(x: Float64Array = new Float64Array(this.n)): Float64Array {
    for (let c = 0; c < this.n; c++) x[c] = this.value(c);
    return x;
  }
}
