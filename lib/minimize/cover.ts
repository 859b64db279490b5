/**
 * Minimum-weight cover of (output, ON-minterm) rows by multi-output primes.
 *
 * Essential primes are taken on the sparse matrix first; the remaining cyclic
 * core goes into bitsets, where row dominance, column dominance and
 * essentials are applied at every node of a branch-and-bound. The bound at a
 * node is a greedy set of independent rows (no live column covers two of
 * them), each charged its cheapest live column: any cover needs distinct
 * columns for them, so the bound is proven.
 *
 * Stronger bounds come from Lagrangian relaxation (subgradient steps) and,
 * under a column budget and at root-only searches, from the LP relaxation
 * solved by dual simplex. At such a root the LP is tightened by rounds of
 * Chvátal–Gomory cuts (lp.ts), which hold for every cover of the root's
 * problem and so enter the LP of every node below; an LP dive (columns fixed
 * at 1 one step at a time) looks for an incumbent. A later search on the
 * same problem may take the cuts over when its root reductions leave the
 * same columns, which the covers' weights decide only through their order.
 */

import { CoverLp, type LpCut } from "./lp";

export interface CoverProblem {
  /** rows[c] = row indices covered by column c. */
  colRows: Int32Array[];
  weight: number[];
  rowCount: number;
  deadline: number;
  /** At most this many columns in the cover (the search then looks only among such covers). */
  maxColumns?: number;
  /** A known cover (column indices) to start from. */
  incumbent?: number[];
  /** Rows → columns of `colRows` ({@link rowColumns}), when the caller already has it. */
  rowCols?: { start: Int32Array; cols: Int32Array };
  /** Stop after the root's reductions and LP: `exact` only when they prove the incumbent optimal. */
  rootOnly?: boolean;
  /**
   * Cuts from an earlier search on the same columns and rows (its
   * {@link CoverSolution.cuts}); used only when they were found under no
   * budget or one no tighter than this search's, and this search's root
   * reductions leave exactly the columns live and taken that they were found at.
   */
  cuts?: CutPool;
  /** Core size (rows × columns) above which the exact search is not attempted; default 3e8 (about 80 MB of bitsets). */
  maxCoreCells?: number;
}

/** Valid inequalities over the problem's columns, with the problem and root reductions they assume. */
export interface CutPool {
  cuts: LpCut[];
  /** The column budget they were found under (the cuts may use it), or -1 for none. */
  budget: number;
  /** The problem's rows and columns, as a check that a later search is on the same problem. */
  rowCount: number;
  columns: number;
  /** Columns live at the root after its reductions, ascending. */
  live: number[];
  /** Columns taken by then (the sparse essentials and the root's), ascending. */
  taken: number[];
}

export interface CoverSolution {
  chosen: number[];
  /** The cuts the search found at its root, for a later search on the same problem. */
  cuts?: CutPool;
  weight: number;
  /** Proven lower bound on the minimum weight. */
  lowerBound: number;
  exact: boolean;
}

/** The indices of the set bits of a bitset, ascending. */
function members(words: Uint32Array): number[] {
  const out: number[] = [];
  for (let k = 0; k < words.length; k++) {
    let x = words[k]!;
    while (x !== 0) {
      const b = x & -x;
      x ^= b;
      out.push(k * 32 + 31 - Math.clz32(b));
    }
  }
  return out;
}

/** Rows → columns, flattened: the columns of row r are cols[start[r] .. start[r + 1]), ascending. */
export function rowColumns(colRows: Int32Array[], rowCount: number): { start: Int32Array; cols: Int32Array } {
  const start = new Int32Array(rowCount + 1);
  for (const rs of colRows) for (let i = 0; i < rs.length; i++) start[rs[i]! + 1]!++;
  for (let r = 0; r < rowCount; r++) start[r + 1]! += start[r]!;
  const fill = start.slice(0, rowCount);
  const cols = new Int32Array(start[rowCount]!);
  for (let c = 0; c < colRows.length; c++) {
    const rs = colRows[c]!;
    for (let i = 0; i < rs.length; i++) cols[fill[rs[i]!]!++] = c;
  }
  return { start, cols };
}

export function solveCover(p: CoverProblem): CoverSolution {
  const C = p.colRows.length;
  const R = p.rowCount;
  const rc = p.rowCols ?? rowColumns(p.colRows, R);
  for (let r = 0; r < R; r++) {
    if (rc.start[r + 1] === rc.start[r]) throw new Error(`internal: row ${r} has no covering prime`);
  }
  // Sparse essentials, repeated: taking an essential can make no new essentials
  // without column removal, so one pass suffices here.
  const covered = new Uint8Array(R);
  const chosen: number[] = [];
  const taken = new Uint8Array(C);
  let base = 0;
  for (let r = 0; r < R; r++) {
    if (covered[r] || rc.start[r + 1]! - rc.start[r]! !== 1) continue;
    const c = rc.cols[rc.start[r]!]!;
    if (!taken[c]) {
      taken[c] = 1;
      chosen.push(c);
      base += p.weight[c]!;
    }
    for (const rr of p.colRows[c]!) covered[rr] = 1;
  }
  const coreRows: number[] = [];
  for (let r = 0; r < R; r++) if (!covered[r]) coreRows.push(r);
  if (coreRows.length === 0) return { chosen, weight: base, lowerBound: base, exact: true };
  const rowMap = new Int32Array(R).fill(-1);
  for (let i = 0; i < coreRows.length; i++) rowMap[coreRows[i]!] = i;
  // Core columns with their core rows, in one pass.
  const coreCols: number[] = [];
  const coreColRows: Int32Array[] = [];
  const buf = new Int32Array(coreRows.length);
  for (let c = 0; c < C; c++) {
    if (taken[c]) continue;
    const rs = p.colRows[c]!;
    let k = 0;
    for (let i = 0; i < rs.length; i++) {
      const m = rowMap[rs[i]!]!;
      if (m >= 0) buf[k++] = m;
    }
    if (k === 0) continue;
    coreCols.push(c);
    coreColRows.push(buf.slice(0, k));
  }
  const cells = coreRows.length * coreCols.length;
  const bb = new BranchAndBound(
    coreRows.length,
    coreColRows,
    coreCols.map((c) => p.weight[c]!),
    p.deadline,
    cells > (p.maxCoreCells ?? 3e8),
  );
  if (p.maxColumns !== undefined) bb.card = p.maxColumns - chosen.length;
  bb.rootOnly = p.rootOnly === true;
  // Each column's core index, -1 outside the core.
  const coreIndex = new Int32Array(C).fill(-1);
  for (let i = 0; i < coreCols.length; i++) coreIndex[coreCols[i]!] = i;
  const inCoreCol = (c: number) => c >= 0 && c < C && coreIndex[c]! >= 0;
  // Cuts found under a budget hold only under that budget or a tighter one.
  const budget = p.maxColumns ?? -1;
  const poolFits = (pool: CutPool) =>
    pool.rowCount === p.rowCount && pool.columns === C && (pool.budget < 0 || (budget >= 0 && budget <= pool.budget));
  if (p.cuts && poolFits(p.cuts)) {
    // To core indices; a column outside the core means another problem, and the cuts are not used.
    const inCore = (cs: ArrayLike<number>) => Array.prototype.every.call(cs, inCoreCol);
    const taken = new Set(chosen);
    const rootTaken = p.cuts.taken.filter((c) => !taken.has(c));
    if (inCore(p.cuts.live) && inCore(rootTaken) && p.cuts.cuts.every((cut) => inCore(cut.cols))) {
      const live = new Uint32Array((coreCols.length + 31) >>> 5);
      for (const c of p.cuts.live) live[coreIndex[c]! >>> 5]! |= 1 << (coreIndex[c]! & 31);
      bb.cutsIn = {
        cuts: p.cuts.cuts.map((cut) => ({ cols: Int32Array.from(cut.cols, (c) => coreIndex[c]!), val: cut.val, rhs: cut.rhs })),
        live,
        taken: rootTaken.map((c) => coreIndex[c]!).sort((a, b) => a - b),
      };
    }
  }
  if (p.incumbent) {
    const mapped = p.incumbent.filter(inCoreCol).map((c) => coreIndex[c]!);
    bb.offer(mapped);
  }
  const res = bb.run();
  const cuts: CutPool | undefined = bb.cuts.length
    ? {
        cuts: bb.cuts.map((cut) => ({ cols: Int32Array.from(cut.cols, (c) => coreCols[c]!), val: cut.val, rhs: cut.rhs })),
        budget,
        rowCount: R,
        columns: C,
        live: members(bb.rootLive).map((c) => coreCols[c]!),
        taken: chosen.concat(bb.rootTaken.map((c) => coreCols[c]!)).sort((a, b) => a - b),
      }
    : undefined;
  for (const c of res.chosen) chosen.push(coreCols[c]!);
  return { chosen, weight: base + res.weight, lowerBound: base + res.lowerBound, exact: res.exact, cuts };
}

/** Dominance tests at inner nodes: bit 0 columns, bit 1 rows (the root always runs both). */
let NODE_DOMINANCE = 1;
/**
 * Search settings, exported so that experiments can vary them: the largest
 * core a root-only search solves the LP of (its cost grows with rows²), subgradient
 * steps at inner nodes, steps without improvement before the step size
 * halves, the first step size at inner nodes, and the depth down to which the
 * Lagrangian primal heuristic runs (every `heurEvery` steps). In the
 * literal phase (a column budget), nodes down to depth `lpDepth` also solve
 * the LP relaxation by dual simplex when at most `lpMaxRows` rows are live.
 * The LP roots add up to `cutRounds` (root-only: `rootCutRounds`) rounds of
 * at most `cutsPerRound` cuts, stopping at round `cutStall` + 1 without gain,
 * and dive at most `diveSteps` steps, fixing at once every column at
 * `diveFixAbove` or more. LPs of `rowGenMin` rows or more start on the
 * fraction `rowGenStart` of them and add the others as they are needed.
 */
export const TUNING = { rowGenMin: 60, rowGenStart: 0.5, cutStall: 2, diveSteps: 60, diveFixAbove: 0.9, rootCutRounds: 10, cutRounds: 10, cutsPerRound: 20, rootOnlyMaxRows: 400, lpMaxRows: 400, lpDepth: Infinity, rootIters: 600, nodeIters: 100, stall: 15, nodeLambda: 2, heurDepth: 0, heurEvery: 25, ascent: 2, rootAscent: 1, ascentMid: 0.25 };
export function setNodeDominance(d: number): void {
  NODE_DOMINANCE = d;
}

/** Binary max-heap of (score, column): higher score first, lower column among equal scores. */
class ScoreHeap {
  private readonly score: Float64Array;
  private readonly col: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.score = new Float64Array(capacity);
    this.col = new Int32Array(capacity);
  }
  private before(i: number, j: number): boolean {
    const a = this.score[i]!;
    const b = this.score[j]!;
    return a > b || (a === b && this.col[i]! < this.col[j]!);
  }
  private swap(i: number, j: number): void {
    const s = this.score[i]!;
    this.score[i] = this.score[j]!;
    this.score[j] = s;
    const c = this.col[i]!;
    this.col[i] = this.col[j]!;
    this.col[j] = c;
  }
  topScore(): number {
    return this.score[0]!;
  }
  topCol(): number {
    return this.col[0]!;
  }
  push(score: number, col: number): void {
    let i = this.size++;
    this.score[i] = score;
    this.col[i] = col;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.before(i, parent)) break;
      this.swap(i, parent);
      i = parent;
    }
  }
  pop(): void {
    const last = --this.size;
    if (last === 0) return;
    this.score[0] = this.score[last]!;
    this.col[0] = this.col[last]!;
    for (let i = 0; ; ) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < last && this.before(l, m)) m = l;
      if (r < last && this.before(r, m)) m = r;
      if (m === i) break;
      this.swap(i, m);
      i = m;
    }
  }
}

/** Cuts over core columns with the root they were found at (live columns as a bitset, taken columns ascending). */
interface CorePool {
  cuts: LpCut[];
  live: Uint32Array;
  taken: number[];
}

function sameBits(a: Uint32Array, b: Uint32Array): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}

/** A node's LP: its bound and reduced costs (over core columns), the solution, and at a root the solved LP (over `liveCols`). */
interface LpNode {
  lb: number;
  rc: Float64Array;
  liveCols: number[];
  x: Float64Array;
  /** Kept at a root only, for the dive (then released). */
  lp: CoverLp | null;
  /** Solves an LP of this node's rows (the LP above after changes), adding the rows it leaves under 1; a dive passes track = false. */
  solveAll: (lp: CoverLp, track?: boolean) => "optimal" | "infeasible" | "stopped";
}

class BranchAndBound {
  readonly WR: number;
  readonly WC: number;
  readonly colBits: Uint32Array;
  readonly rowBits: Uint32Array;
  /** Static sparse lists; liveness is read from the node's bitsets. */
  readonly rowColsS: Int32Array[];
  best = Infinity;
  bestChosen: number[] = [];
  /** Column budget of the core, or -1 for none. */
  card = -1;
  /** See {@link CoverProblem.rootOnly}. */
  rootOnly = false;
  private readonly nnz: number;
  private csr = new Int32Array(0);
  private rcBuf = new Float64Array(0);
  private gBuf = new Float64Array(0);
  aborted = false;
  nodes = 0;
  /** Scratch lists of columns and rows for the reductions. */
  private readonly bufC: Int32Array;
  private readonly bufR: Int32Array;
  /**
   * For {@link reduce}: rows whose columns and columns whose rows changed since their last test (essential,
   * row dominance, column dominance). Sets only shrink, so a test that found nothing finds nothing again until then.
   */
  private readonly dirtyEss: Uint8Array;
  private readonly dirtyRow: Uint8Array;
  private readonly dirtyCol: Uint8Array;
  /** Cuts found at the root, over core columns: valid for every cover the search considers. */
  readonly cuts: LpCut[] = [];
  /** The root's live columns and taken columns after its reductions (what the cuts assume). */
  rootLive = new Uint32Array(0);
  rootTaken: number[] = [];
  /** Cuts of an earlier search over the same core, with the root they hold at. */
  cutsIn: CorePool | null = null;
  /** Best bound proven at the root of the search (kept for a search cut short). */
  rootBound = -Infinity;

  constructor(
    readonly R: number,
    readonly cols: Int32Array[],
    readonly w: number[],
    readonly deadline: number,
    /** Too big for bitsets: greedy cover and Lagrangian bound only, no search. */
    readonly sparseOnly = false,
  ) {
    const C = cols.length;
    this.WR = (R + 31) >>> 5;
    this.WC = (C + 31) >>> 5;
    this.colBits = new Uint32Array(sparseOnly ? 0 : C * this.WR);
    this.rowBits = new Uint32Array(sparseOnly ? 0 : R * this.WC);
    // Rows → columns by counting (ascending columns per row), bitsets both ways unless too big.
    const deg = new Int32Array(R);
    let nnz = 0;
    for (let c = 0; c < C; c++) {
      const l = cols[c]!;
      nnz += l.length;
      for (let i = 0; i < l.length; i++) {
        const r = l[i]!;
        deg[r]!++;
        if (!sparseOnly) {
          this.colBits[c * this.WR + (r >>> 5)]! |= 1 << (r & 31);
          this.rowBits[r * this.WC + (c >>> 5)]! |= 1 << (c & 31);
        }
      }
    }
    const flat = new Int32Array(nnz);
    this.rowColsS = new Array<Int32Array>(R);
    for (let r = 0, at = 0; r < R; r++) {
      this.rowColsS[r] = flat.subarray(at, at + deg[r]!);
      at += deg[r]!;
      deg[r] = 0;
    }
    for (let c = 0; c < C; c++) {
      const l = cols[c]!;
      for (let i = 0; i < l.length; i++) {
        const r = l[i]!;
        this.rowColsS[r]![deg[r]!++] = c;
      }
    }
    this.bufC = new Int32Array(C);
    this.bufR = new Int32Array(R);
    this.dirtyEss = new Uint8Array(R);
    this.dirtyRow = new Uint8Array(R);
    this.dirtyCol = new Uint8Array(C);
    this.nnz = nnz;
  }

  /** Offers a known cover of the core as incumbent. */
  offer(chosen: number[]): void {
    const covered = new Uint8Array(this.R);
    for (const c of chosen) for (const r of this.cols[c]!) covered[r] = 1;
    if (!covered.every((x) => x === 1)) return;
    if (this.card >= 0 && chosen.length > this.card) return;
    const w = chosen.reduce((a, c) => a + this.w[c]!, 0);
    if (w < this.best) {
      this.best = w;
      this.bestChosen = chosen.slice();
    }
  }

  run(): { chosen: number[]; weight: number; lowerBound: number; exact: boolean } {
    const rowsA = new Uint32Array(this.WR);
    for (let r = 0; r < this.R; r++) rowsA[r >>> 5]! |= 1 << (r & 31);
    const colsA = new Uint32Array(this.WC);
    for (let c = 0; c < this.cols.length; c++) colsA[c >>> 5]! |= 1 << (c & 31);
    // A root-only search takes its incumbent from the LP's rounding.
    if (this.card < 0 && !this.rootOnly) this.greedy(rowsA, colsA);
    const u = new Float64Array(this.R + 1);
    for (let r = 0; r < this.R; r++) u[r] = Infinity;
    // Start the budget multiplier where the combined products-then-literals weight would put it.
    u[this.R] = this.card >= 0 && this.bestChosen.length ? Math.max(1, this.best / this.bestChosen.length) : 0;
    for (let c = 0; c < this.cols.length; c++) {
      const share = this.w[c]! / this.cols[c]!.length;
      for (const r of this.cols[c]!) if (share < u[r]!) u[r] = share;
    }
    if (this.sparseOnly) {
      const lag = this.lagrange(rowsA, colsA, u, TUNING.rootIters, this.best, this.card);
      const lb = Math.min(this.best, Math.max(this.bound(rowsA, colsA).lb, Math.ceil(lag.lb - 1e-6)));
      return { chosen: this.bestChosen, weight: this.best, lowerBound: lb, exact: lb === this.best };
    }
    this.search(rowsA, colsA, 0, [], u, 0);
    const exact = !this.aborted;
    return {
      chosen: this.bestChosen,
      weight: this.best,
      lowerBound: exact ? this.best : Math.min(this.best, Math.max(0, this.rootBound)),
      exact,
    };
  }

  /** The live columns of row r into `out`; returns how many. */
  private colsOfRowInto(r: number, colsA: Uint32Array, out: Int32Array): number {
    const l = this.rowColsS[r]!;
    let n = 0;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      if ((colsA[c >>> 5]! >>> (c & 31)) & 1) out[n++] = c;
    }
    return n;
  }

  /** The live rows of column c into `out`; returns how many. */
  private rowsOfColInto(c: number, rowsA: Uint32Array, out: Int32Array): number {
    const l = this.cols[c]!;
    let n = 0;
    for (let i = 0; i < l.length; i++) {
      const r = l[i]!;
      if ((rowsA[r >>> 5]! >>> (r & 31)) & 1) out[n++] = r;
    }
    return n;
  }

  /** {@link colsOfRowInto} into an array, for the callers that keep or sort the list (a direct loop: this is hot in the bounds). */
  private colsOfRow(r: number, colsA: Uint32Array, out: number[]): void {
    out.length = 0;
    const l = this.rowColsS[r]!;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      if ((colsA[c >>> 5]! >>> (c & 31)) & 1) out.push(c);
    }
  }

  private rowDegree(r: number, colsA: Uint32Array): number {
    const l = this.rowColsS[r]!;
    let d = 0;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      d += (colsA[c >>> 5]! >>> (c & 31)) & 1;
    }
    return d;
  }

  private colCount(c: number, rowsA: Uint32Array): number {
    const l = this.cols[c]!;
    let d = 0;
    for (let i = 0; i < l.length; i++) {
      const r = l[i]!;
      d += (rowsA[r >>> 5]! >>> (r & 31)) & 1;
    }
    return d;
  }

  private take(c: number, rowsA: Uint32Array, colsA: Uint32Array): void {
    const base = c * this.WR;
    for (let k = 0; k < this.WR; k++) rowsA[k]! &= ~this.colBits[base + k]!;
    colsA[c >>> 5]! &= ~(1 << (c & 31));
  }

  /** Greedy cover (weight per newly covered row), then redundant columns dropped: the first incumbent. */
  private greedy(rowsA0: Uint32Array, colsA0: Uint32Array): void {
    // Sparse: per column, how many live rows it still reaches.
    const C = this.cols.length;
    const rowCols: number[][] = Array.from({ length: this.R }, () => []);
    const left = new Int32Array(C);
    const coveredRow = new Uint8Array(this.R);
    for (let r = 0; r < this.R; r++) if (!((rowsA0[r >>> 5]! >>> (r & 31)) & 1)) coveredRow[r] = 1;
    for (let c = 0; c < C; c++) {
      if (!((colsA0[c >>> 5]! >>> (c & 31)) & 1)) continue;
      for (const r of this.cols[c]!) {
        if (coveredRow[r]) continue;
        rowCols[r]!.push(c);
        left[c]!++;
      }
    }
    let remaining = 0;
    for (let r = 0; r < this.R; r++) if (!coveredRow[r]) remaining++;
    const chosen: number[] = [];
    // The column of highest score (lowest index among equals), from a heap of scores that can only fall:
    // an entry whose stored score is still its score is the maximum; a stale one goes back with its score.
    const heap = new ScoreHeap(C);
    for (let c = 0; c < C; c++) if (left[c]! > 0) heap.push(left[c]! / this.w[c]!, c);
    while (remaining > 0) {
      let bestC = -1;
      while (heap.size > 0) {
        const c = heap.topCol();
        const stored = heap.topScore();
        heap.pop();
        if (left[c] === 0) continue;
        const score = left[c]! / this.w[c]!;
        if (score === stored) {
          bestC = c;
          break;
        }
        heap.push(score, c);
      }
      if (bestC < 0) return;
      chosen.push(bestC);
      for (const r of this.cols[bestC]!) {
        if (coveredRow[r]) continue;
        coveredRow[r] = 1;
        remaining--;
        for (const c of rowCols[r]!) left[c]!--;
      }
    }
    // Drop columns whose rows the others cover, most expensive first.
    const order = chosen.slice().sort((a, b) => this.w[b]! - this.w[a]!);
    const count = new Int32Array(this.R);
    for (const c of chosen) for (const r of this.cols[c]!) count[r]!++;
    const keep = new Set(chosen);
    for (const c of order) {
      if (this.cols[c]!.every((r) => count[r]! > 1)) {
        keep.delete(c);
        for (const r of this.cols[c]!) count[r]!--;
      }
    }
    const list = [...keep];
    const wsum = list.reduce((a, c) => a + this.w[c]!, 0);
    if (wsum < this.best) {
      this.best = wsum;
      this.bestChosen = list;
    }
  }

  /**
   * Essentials, column dominance and row dominance until nothing changes.
   * Returns the weight of the columns taken, or -1 when some row can no longer be covered.
   */
  private reduce(rowsA: Uint32Array, colsA: Uint32Array, picked: number[], dominance = 3): number {
    let added = 0;
    const WR = this.WR;
    const WC = this.WC;
    const bufC = this.bufC;
    const bufR = this.bufR;
    const { dirtyEss, dirtyRow, dirtyCol, rowColsS } = this;
    dirtyEss.fill(1);
    dirtyRow.fill(1);
    dirtyCol.fill(1);
    // A row's columns changed: its essential and dominance tests are due again; likewise a column's rows.
    const rowChanged = (r: number) => {
      dirtyEss[r] = 1;
      dirtyRow[r] = 1;
    };
    const colsOfRowChanged = (r: number) => {
      const l = rowColsS[r]!;
      for (let i = 0; i < l.length; i++) dirtyCol[l[i]!] = 1;
    };
    for (let changed = true; changed; ) {
      changed = false;
      if (Date.now() > this.deadline) {
        this.aborted = true;
        return added;
      }
      // Essentials: a live row with one live column (counted up to two).
      for (let k = 0; k < WR; k++) {
        let x = rowsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const r = k * 32 + 31 - Math.clz32(b);
          if (!((rowsA[r >>> 5]! >>> (r & 31)) & 1) || dirtyEss[r] === 0) continue;
          dirtyEss[r] = 0;
          const l = this.rowColsS[r]!;
          let n = 0;
          let only = -1;
          for (let i = 0; i < l.length && n < 2; i++) {
            const c = l[i]!;
            if ((colsA[c >>> 5]! >>> (c & 31)) & 1) {
              n++;
              only = c;
            }
          }
          if (n === 0) return -1;
          if (n === 1) {
            picked.push(only);
            added += this.w[only]!;
            // The columns of the rows it covers lose rows.
            const rs = this.cols[only]!;
            for (let i = 0; i < rs.length; i++) if ((rowsA[rs[i]! >>> 5]! >>> (rs[i]! & 31)) & 1) colsOfRowChanged(rs[i]!);
            this.take(only, rowsA, colsA);
            x &= rowsA[k]!;
            changed = true;
          }
        }
      }
      // Column dominance: c1 goes when some c2 covers all its live rows at no greater weight.
      for (let k = 0; k < WC && dominance & 1; k++) {
        let x = colsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const c1 = k * 32 + 31 - Math.clz32(b);
          if (dirtyCol[c1] === 0) continue;
          dirtyCol[c1] = 0;
          const nr = this.rowsOfColInto(c1, rowsA, bufR);
          if (nr === 0) {
            colsA[k]! &= ~b;
            changed = true;
            continue;
          }
          const nc = this.colsOfRowInto(bufR[0]!, colsA, bufC);
          for (let q = 0; q < nc; q++) {
            const c2 = bufC[q]!;
            if (c2 === c1 || this.w[c2]! > this.w[c1]!) continue;
            let subset = true;
            for (let i = 1; i < nr; i++) {
              const r = bufR[i]!;
              if (!((this.rowBits[r * WC + (c2 >>> 5)]! >>> (c2 & 31)) & 1)) {
                subset = false;
                break;
              }
            }
            if (!subset) continue;
            if (this.w[c2] === this.w[c1] && c2 > c1 && this.colCount(c2, rowsA) === nr) continue;
            colsA[k]! &= ~b;
            for (let i = 0; i < nr; i++) rowChanged(bufR[i]!);
            changed = true;
            break;
          }
        }
      }
      // Row dominance: a row whose live columns include another row's live columns goes.
      for (let k = 0; k < WR && dominance & 2; k++) {
        let x = rowsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const r1 = k * 32 + 31 - Math.clz32(b);
          if (!((rowsA[r1 >>> 5]! >>> (r1 & 31)) & 1) || dirtyRow[r1] === 0) continue;
          dirtyRow[r1] = 0;
          const nc = this.colsOfRowInto(r1, colsA, bufC);
          if (nc === 0) return -1;
          // Rows sharing r1's first column are the only candidates.
          const nr = this.rowsOfColInto(bufC[0]!, rowsA, bufR);
          for (let q = 0; q < nr; q++) {
            const r2 = bufR[q]!;
            if (r2 === r1) continue;
            let subset = true;
            for (let i = 1; i < nc; i++) {
              const c = bufC[i]!;
              if (!((this.colBits[c * WR + (r2 >>> 5)]! >>> (r2 & 31)) & 1)) {
                subset = false;
                break;
              }
            }
            if (!subset) continue;
            if (r2 < r1 && this.rowDegree(r2, colsA) === nc) continue;
            rowsA[r2 >>> 5]! &= ~(1 << (r2 & 31));
            colsOfRowChanged(r2);
            changed = true;
          }
        }
      }
    }
    return added;
  }

  /** Independent-row bound and the live row with the fewest columns (the branching row). */
  private bound(rowsA: Uint32Array, colsA: Uint32Array): { lb: number; branchRow: number; independent: number } {
    const rows = members(rowsA);
    const deg: number[] = [];
    for (const r of rows) deg[r] = this.rowDegree(r, colsA);
    if (rows.length === 0) return { lb: 0, branchRow: -1, independent: 0 };
    rows.sort((a, b) => deg[a]! - deg[b]!);
    const blocked = new Uint8Array(this.R);
    const tmp: number[] = [];
    let lb = 0;
    let independent = 0;
    for (const r of rows) {
      if (blocked[r]) continue;
      independent++;
      this.colsOfRow(r, colsA, tmp);
      let m = Infinity;
      for (const c of tmp) {
        if (this.w[c]! < m) m = this.w[c]!;
        const l = this.cols[c]!;
        for (let i = 0; i < l.length; i++) blocked[l[i]!] = 1;
      }
      lb += m;
    }
    return { lb, branchRow: rows[0]!, independent };
  }


  /**
   * Lagrangian bound of the set-cover relaxation by subgradient steps,
   * warm-started from `u` (updated in place). Returns the best bound and the
   * reduced costs at that bound; a column whose reduced cost lifts the bound
   * to the incumbent cannot be in a better cover.
   */
  private lagrange(
    rowsA: Uint32Array,
    colsA: Uint32Array,
    u: Float64Array,
    iters: number,
    gapTarget: number,
    /** Column budget K ≥ 0 relaxed with the multiplier u[R], or -1. */
    K = -1,
    /** When given, the primal heuristic runs on improving multipliers and the target follows the incumbent. */
    heur?: { cost: number; here: number[] },
  ): { lb: number; rc: Float64Array; liveCols: number[] } {
    const liveRows = members(rowsA);
    const liveCols = members(colsA);
    // Live rows of the live columns, flattened (CSR) so the inner loop allocates nothing.
    if (this.csr.length < this.nnz) this.csr = new Int32Array(this.nnz);
    const csr = this.csr;
    const start = new Int32Array(liveCols.length + 1);
    let nz = 0;
    for (let i = 0; i < liveCols.length; i++) {
      start[i] = nz;
      const l = this.cols[liveCols[i]!]!;
      for (let q = 0; q < l.length; q++) {
        const r = l[q]!;
        if ((rowsA[r >>> 5]! >>> (r & 31)) & 1) csr[nz++] = r;
      }
    }
    start[liveCols.length] = nz;
    const C = this.cols.length;
    if (this.rcBuf.length < C) {
      this.rcBuf = new Float64Array(C);
      this.gBuf = new Float64Array(this.R);
    }
    const rc = this.rcBuf;
    const bestRc = new Float64Array(C);
    const g = this.gBuf;
    let best = -Infinity;
    let lambda = iters === TUNING.rootIters ? 2 : TUNING.nodeLambda;
    let stall = 0;
    const R = this.R;
    let lastHeur = -Infinity;
    const bestU = new Float64Array(u.length);
    for (let it = 0; it < iters; it++) {
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
        let s = this.w[c]! + mu;
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
      } else if (++stall >= TUNING.stall) {
        lambda /= 2;
        stall = 0;
      }
      if (heur && it % TUNING.heurEvery === TUNING.heurEvery - 1 && best > lastHeur) {
        lastHeur = best;
        this.lagHeuristic(rowsA, colsA, bestRc, liveCols, heur.cost, heur.here);
        gapTarget = Math.min(gapTarget, this.best - heur.cost);
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
    if ((iters === TUNING.rootIters ? TUNING.rootAscent : TUNING.ascent) > 0 && best > -Infinity && !(Math.ceil(best - 1e-6) >= gapTarget)) {
      const asc = this.ascend(liveRows, liveCols, start, csr, bestU, K, iters === TUNING.rootIters ? TUNING.rootAscent : TUNING.ascent);
      if (asc.lb > best) {
        best = asc.lb;
        for (const c of liveCols) bestRc[c] = asc.rc[c]!;
      }
    }
    if (best > -Infinity) u.set(bestU);
    return { lb: best, rc: bestRc, liveCols };
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
  private lpBound(
    rowsA: Uint32Array,
    liveCols: number[],
    K: number,
    beat: number,
    maxRows = TUNING.lpMaxRows,
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
    const cutRounds = root?.cutRounds ?? 0;
    const cost = root?.cost ?? 0;
    const colsA = root?.colsA;
    const liveRows = members(rowsA);
    // The dense inverse costs rows² per pivot: past a few hundred rows the LP costs more than it saves.
    if (liveRows.length > maxRows) return null;
    const local = new Int32Array(this.R).fill(-1);
    for (let i = 0; i < liveRows.length; i++) local[liveRows[i]!] = i;
    // Each live column's live rows (local indices), as one list (column i's rows at cRows[cStart[i]] ..).
    const NL = liveCols.length;
    const cStart = new Int32Array(NL + 1);
    let cells = 0;
    for (const c of liveCols) cells += this.cols[c]!.length;
    const cRows = new Int32Array(cells);
    const w: number[] = [];
    cells = 0;
    for (let i = 0; i < NL; i++) {
      const c = liveCols[i]!;
      const l = this.cols[c]!;
      for (let q = 0; q < l.length; q++) {
        const m = local[l[q]!]!;
        if (m >= 0) cRows[cells++] = m;
      }
      cStart[i + 1] = cells;
      w.push(this.w[c]!);
    }
    // The cuts at this node: taken columns at 1, columns no longer live at 0.
    const lpCuts: LpCut[] = [];
    if (this.cuts.length) {
      const colLocal = new Int32Array(this.cols.length).fill(-1);
      for (let i = 0; i < liveCols.length; i++) colLocal[liveCols[i]!] = i;
      const taken = new Uint8Array(this.cols.length);
      for (const c of here) taken[c] = 1;
      for (const cut of this.cuts) {
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
    const rowGen = RL >= TUNING.rowGenMin;
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
        if (r0.length >= TUNING.rowGenStart * RL) break;
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
    const lp = new CoverLp(lpRows, lpCols, w, K, lpCuts, (cutRounds > 0 || rowGen ? 2 * TUNING.cutsPerRound + 16 : 0) + (RL - lpRows));
    const xRowGen = new Float64Array(NL);
    /** Solves, adding the rows left under 1 until none is. */
    const solveAll = (at: CoverLp, track = true): "optimal" | "infeasible" | "stopped" => {
      let st = at.solve(this.deadline, maxIters());
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
        st = at.solve(this.deadline, maxIters());
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
      const xs = new Float64Array(this.cols.length);
      for (let i = 0; i < liveCols.length; i++) xs[liveCols[i]!] = xl[i]!;
      this.lpRounding(rowsA, colsA!, xs, liveCols, cost, here);
    };
    let lastObj = cutRounds > 0 && status === "optimal" ? lp.objective() : 0;
    let stalled = 0;
    for (let round = 0; round < cutRounds && status === "optimal"; round++) {
      if (colsA) roundAt(lp);
      // The weights are integers: a bound that rounds up to the incumbent needs no more cuts.
      if (cost + Math.ceil(lastObj - 1e-6) >= this.best) break;
      const fresh = lp.gomoryCuts(TUNING.cutsPerRound);
      if (fresh.length === 0) break;
      for (const f of fresh) {
        lpCuts.push(f);
        this.cuts.push({ cols: Int32Array.from(f.cols, (i) => liveCols[i]!), val: f.val, rhs: f.rhs });
      }
      lp.withCuts(fresh);
      status = solveAll(lp);
      if (status !== "optimal") break;
      const obj = lp.objective();
      if (obj < lastObj + 1e-3 && ++stalled > TUNING.cutStall) break;
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
    const rc = new Float64Array(this.cols.length);
    const s = new Float64Array(liveCols.length);
    for (let i = 0; i < liveCols.length; i++) {
      let v = w[i]! + mu;
      const l = lpCols[i]!;
      for (let q = 0; q < l.length; q++) v -= u[l[q]!]!;
      s[i] = v;
    }
    for (let g = 0; g < lpCuts.length; g++) {
      const lg = lam[g]!;
      if (lg === 0) continue;
      const cut = lpCuts[g]!;
      L -= lg * cut.rhs;
      mag += Math.abs(lg * cut.rhs);
      for (let k = 0; k < cut.cols.length; k++) s[cut.cols[k]!]! += lg * cut.val[k]!;
    }
    for (let i = 0; i < liveCols.length; i++) {
      rc[liveCols[i]!] = s[i]!;
      if (s[i]! < 0) {
        L += s[i]!;
        mag -= s[i]!;
      }
    }
    // Float sums of n terms err by at most about n·2^-53 of their absolute size (measured: 3e-7 at
    // L ≈ 3e8); 1e-11 of it, far above that and far below 1, keeps the bound proven before its ceiling is taken.
    L -= 1e-11 * mag + 1e-9;
    const xl = lp.primal();
    const x = new Float64Array(this.cols.length);
    for (let i = 0; i < liveCols.length; i++) x[liveCols[i]!] = xl[i]!;
    if (!root || !(L > beat)) lp.release();
    if (!(L > beat)) return null;
    return { lb: L, rc, liveCols, x, lp: root ? lp : null, solveAll };
  }

  /**
   * Coordinate ascent on the Lagrangian from `u` (changed in place): each row
   * multiplier moves to where its cheapest live column's reduced cost reaches
   * zero, which never lowers the bound; then the budget multiplier moves to
   * where exactly K columns have negative reduced cost. Returns the bound and
   * the reduced costs at the final multipliers.
   */
  private ascend(
    liveRows: number[],
    liveCols: number[],
    start: Int32Array,
    csr: Int32Array,
    u: Float64Array,
    K: number,
    sweeps: number,
  ): { lb: number; rc: Float64Array } {
    const R = this.R;
    const C = this.cols.length;
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
      let v = this.w[liveCols[i]!]!;
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
        const target = TUNING.ascentMid > 0 && Number.isFinite(m2) ? m1 + TUNING.ascentMid * (m2 - m1) : m1;
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

  /**
   * Lagrangian primal heuristic: the columns of negative reduced cost, then
   * the cheapest per newly covered row, then redundant columns dropped
   * (costliest first). Offers the result as incumbent when it beats it.
   */
  private lagHeuristic(rowsA: Uint32Array, colsA: Uint32Array, rc: Float64Array, liveCols: number[], cost: number, here: number[]): void {
    const need = rowsA.slice();
    const isNeeded = (r: number) => ((need[r >>> 5]! >>> (r & 31)) & 1) === 1;
    const chosen: number[] = [];
    // Only the columns of negative reduced cost are taken in order: sort just those (stable, as the full sort was).
    const order: number[] = [];
    for (let i = 0; i < liveCols.length; i++) if (rc[liveCols[i]!]! < 0) order.push(liveCols[i]!);
    order.sort((a, b) => rc[a]! - rc[b]!);
    const takeCol = (c: number) => {
      chosen.push(c);
      const l = this.cols[c]!;
      for (let i = 0; i < l.length; i++) need[l[i]! >>> 5]! &= ~(1 << (l[i]! & 31));
    };
    for (const c of order) {
      if (rc[c]! >= 0) break;
      const l = this.cols[c]!;
      for (let i = 0; i < l.length; i++) {
        if (isNeeded(l[i]!)) {
          takeCol(c);
          break;
        }
      }
    }
    const tmp: number[] = [];
    for (let k = 0; k < this.WR; k++) {
      while (need[k]! !== 0) {
        const x = need[k]!;
        const r = k * 32 + 31 - Math.clz32(x & -x);
        this.colsOfRow(r, colsA, tmp);
        if (tmp.length === 0) return;
        let bestC = -1;
        let bestScore = Infinity;
        for (const c of tmp) {
          let fresh = 0;
          const l = this.cols[c]!;
          for (let i = 0; i < l.length; i++) if (isNeeded(l[i]!)) fresh++;
          const score = (this.w[c]! + Math.max(0, rc[c]!)) / fresh;
          if (score < bestScore) {
            bestScore = score;
            bestC = c;
          }
        }
        takeCol(bestC);
      }
    }
    // Redundant columns, costliest first; only live rows count.
    const count = new Int32Array(this.R);
    for (const c of chosen) for (const r of this.cols[c]!) count[r]!++;
    chosen.sort((a, b) => this.w[b]! - this.w[a]! || rc[b]! - rc[a]!);
    let w = cost;
    const kept: number[] = [];
    for (const c of chosen) {
      const l = this.cols[c]!;
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
        w += this.w[c]!;
      }
    }
    if (this.card >= 0 && here.length + kept.length > this.card) return;
    if (w < this.best) {
      this.best = w;
      this.bestChosen = here.concat(kept);
    }
  }

  /**
   * LP diving for an incumbent: columns at or near 1 (else the largest
   * fractional one) are fixed at 1 by single-column rows added to the solved
   * LP, which goes on by dual simplex from its basis; after each step the
   * solution is rounded. Stops when the LP turns integral, infeasible, or
   * its bound reaches the incumbent. The fixing rows hold only for the dive.
   */
  private dive(start: CoverLp, liveCols: number[], solveAll: LpNode["solveAll"], rowsA: Uint32Array, colsA: Uint32Array, cost: number, here: number[]): void {
    const lp = start;
    const n = liveCols.length;
    const fixed = new Uint8Array(n);
    for (let step = 0; step < TUNING.diveSteps; step++) {
      const x = lp.primal();
      const fix: number[] = [];
      let top = -1;
      for (let i = 0; i < n; i++) {
        if (fixed[i]) continue;
        const v = x[i]!;
        if (v > 1 - 1e-9 || v < 1e-9) continue;
        if (v >= TUNING.diveFixAbove) fix.push(i);
        if (top < 0 || v > x[top]!) top = i;
      }
      if (top < 0) break; // integral
      if (fix.length === 0) fix.push(top);
      for (const i of fix) fixed[i] = 1;
      lp.withCuts(fix.map((i) => ({ cols: Int32Array.of(i), val: Int32Array.of(-1), rhs: -1 })));
      if (solveAll(lp, false) !== "optimal") return;
      const xl = lp.primal();
      const xs = new Float64Array(this.cols.length);
      for (let i = 0; i < n; i++) xs[liveCols[i]!] = xl[i]!;
      this.lpRounding(rowsA, colsA, xs, liveCols, cost, here);
      if (cost + Math.ceil(lp.objective() - 1e-6) >= this.best) return;
    }
  }

  /** LP rounding: the support of the LP solution, largest values first, then the cheapest per new row. */
  private lpRounding(rowsA: Uint32Array, colsA: Uint32Array, x: Float64Array, liveCols: number[], cost: number, here: number[]): void {
    const key = new Float64Array(this.cols.length);
    // The support first (a negative key is taken in order); columns at 0 wait for the cheapest-per-new-row step.
    for (const c of liveCols) key[c] = x[c]! > 1e-9 ? -x[c]! : 0;
    this.lagHeuristic(rowsA, colsA, key, liveCols, cost, here);
  }

  private search(rowsA: Uint32Array, colsA: Uint32Array, cost: number, chosen: number[], u: Float64Array, depth: number): void {
    if (this.aborted) return;
    if ((++this.nodes & 63) === 0 && Date.now() > this.deadline) {
      this.aborted = true;
      return;
    }
    const picked: number[] = [];
    const add = this.reduce(rowsA, colsA, picked, depth === 0 ? 3 : NODE_DOMINANCE);
    if (add < 0) return;
    cost += add;
    const here = chosen.concat(picked);
    if (depth === 0) {
      this.rootLive = colsA.slice();
      this.rootTaken = here.slice().sort((a, b) => a - b);
      // Cuts found by an earlier search hold here when its root left the same columns live and taken.
      const pool = this.cutsIn;
      if (pool && sameBits(pool.live, this.rootLive) && pool.taken.length === here.length && pool.taken.every((c, i) => c === this.rootTaken[i])) {
        for (const cut of pool.cuts) this.cuts.push(cut);
      }
    }
    const K = this.card < 0 ? -1 : this.card - here.length;
    if (this.card >= 0 && K < 0) return;
    const { lb, branchRow, independent } = this.bound(rowsA, colsA);
    if (K >= 0 && branchRow >= 0 && independent > K) return;
    if (branchRow < 0) {
      if (cost < this.best) {
        this.best = cost;
        this.bestChosen = here.slice();
      }
      return;
    }
    if (cost + lb >= this.best) return;
    let lpFix: { lb: number; rc: Float64Array } | null = null;
    if (this.rootOnly) {
      // Root only: the LP relaxation and its rounding, no subgradient steps; the search stops unless they close the gap.
      const res = this.lpBound(rowsA, members(colsA), K, -Infinity, TUNING.rootOnlyMaxRows, here, { cutRounds: TUNING.rootCutRounds, cost, colsA });
      if (res && res !== "infeasible") {
        if (res.lp && cost + Math.ceil(res.lb - 1e-6) < this.best) this.dive(res.lp, res.liveCols, res.solveAll, rowsA, colsA, cost, here);
        res.lp?.release();
        res.lp = null;
        this.rootBound = Math.max(this.rootBound, cost + lb, cost + Math.ceil(res.lb - 1e-6));
        if (cost + Math.ceil(res.lb - 1e-6) >= this.best) return;
      }
      this.aborted = true;
      return;
    }
    // In the literal phase the root solves its LP first: when the LP's rounding meets the LP bound,
    // the root's subgradient steps would only confirm it.
    let rootLp: LpNode | null = null;
    if (depth === 0 && K >= 0 && depth <= TUNING.lpDepth) {
      const res = this.lpBound(rowsA, members(colsA), K, -Infinity, TUNING.lpMaxRows, here, { cutRounds: TUNING.cutRounds, cost, colsA });
      if (res === "infeasible") return;
      if (res) {
        if (res.lp && cost + Math.ceil(res.lb - 1e-6) < this.best) this.dive(res.lp, res.liveCols, res.solveAll, rowsA, colsA, cost, here);
        res.lp?.release();
        res.lp = null;
        if (cost + Math.ceil(res.lb - 1e-6) >= this.best) {
          this.rootBound = Math.max(this.rootBound, cost + Math.ceil(res.lb - 1e-6));
          return;
        }
        rootLp = res;
      }
    }
    // Lagrangian bound and reduced-cost fixing.
    const lag = this.lagrange(rowsA, colsA, u, depth === 0 ? TUNING.rootIters : TUNING.nodeIters, this.best - cost, K, depth <= TUNING.heurDepth ? { cost, here } : undefined);
    if (cost + Math.ceil(lag.lb - 1e-6) >= this.best) return;
    // The LP's bound and reduced costs fix columns too; branching keeps the
    // subgradient's order (the LP's many zero reduced costs ordered it worse in trials).
    if (rootLp) lpFix = rootLp;
    else if (depth <= TUNING.lpDepth && K >= 0) {
      // Subgradient steps stall short of the LP optimum; the simplex duals close that gap
      // (at every node: both covering phases of the eleven random 10-input bench cases took 0.7× the time of root only).
      const res = this.lpBound(rowsA, lag.liveCols, K, lag.lb, TUNING.lpMaxRows, here);
      // No fractional cover fits the budget: neither does a cover.
      if (res === "infeasible") return;
      if (res) {
        this.lpRounding(rowsA, colsA, res.x, lag.liveCols, cost, here);
        if (cost + Math.ceil(res.lb - 1e-6) >= this.best) return;
        lpFix = res;
      }
    }
    if (lpFix && !(lpFix.lb > lag.lb)) lpFix = null;
    const lbBest = lpFix ? lpFix.lb : lag.lb;
    if (depth === 0) this.rootBound = Math.max(this.rootBound, cost + lb, cost + Math.ceil(lbBest - 1e-6));
    if (depth <= TUNING.heurDepth) {
      this.lagHeuristic(rowsA, colsA, lag.rc, lag.liveCols, cost, here);
      if (cost + Math.ceil(lbBest - 1e-6) >= this.best) return;
    }
    let fixed = false;
    for (const c of lag.liveCols) {
      const r = lag.rc[c]!;
      const r2 = lpFix ? lpFix.rc[c]! : 0;
      if ((r > 0 && cost + Math.ceil(lag.lb + r - 1e-6) >= this.best) || (r2 > 0 && cost + Math.ceil(lpFix!.lb + r2 - 1e-6) >= this.best)) {
        colsA[c >>> 5]! &= ~(1 << (c & 31));
        fixed = true;
      }
    }
    let branch = branchRow;
    if (fixed) {
      const more: number[] = [];
      const add2 = this.reduce(rowsA, colsA, more, NODE_DOMINANCE);
      if (add2 < 0) return;
      if (more.length) {
        cost += add2;
        for (const c of more) here.push(c);
      }
      const b2 = this.bound(rowsA, colsA);
      if (b2.branchRow < 0) {
        if (cost < this.best) {
          this.best = cost;
          this.bestChosen = here.slice();
        }
        return;
      }
      if (cost + b2.lb >= this.best) return;
      if (K >= 0 && (more.length > K || b2.independent > K - more.length)) return;
      branch = b2.branchRow;
    }
    const cand: number[] = [];
    this.colsOfRow(branch, colsA, cand);
    // Most promising first: lowest reduced cost.
    cand.sort((a, b) => lag.rc[a]! - lag.rc[b]!);
    const cols = colsA.slice();
    for (const c of cand) {
      const r2 = rowsA.slice();
      const c2 = cols.slice();
      this.take(c, r2, c2);
      here.push(c);
      this.search(r2, c2, cost + this.w[c]!, here, u.slice(), depth + 1);
      here.pop();
      if (this.aborted) return;
      // Later branches exclude the columns already explored at this node.
      cols[c >>> 5]! &= ~(1 << (c & 31));
    }
  }
}
