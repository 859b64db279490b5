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
 * Chvátal–Gomory cuts (../lp), which hold for every cover of the root's
 * problem and so enter the LP of every node below; an LP dive (columns fixed
 * at 1 one step at a time) looks for an incumbent. A later search on the
 * same problem may take the cuts over when its root reductions leave the
 * same columns, which the covers' weights decide only through their order.
 *
 * Stages: ./core (the matrix and a node's live sets), ./reduce,
 * ./independent, ./lagrange, ./lp-node (on ../lp), ./primal (incumbents from
 * reduced costs and LP solutions), ./greedy, ./search (the branch-and-bound),
 * ./state (one search's state), ./tuning (its settings).
 */

import { BufferPool, type LpCut } from "../lp";
import { Core, members } from "./core";
import { run } from "./search";
import { Search } from "./state";
import { DEFAULT_TUNING, type CoverTuning } from "./tuning";

export { DEFAULT_TUNING, type CoverTuning } from "./tuning";

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
  rowCols?: RowColumns;
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
  /** Search settings; default {@link DEFAULT_TUNING}. */
  tuning?: CoverTuning;
  /** Where node LPs take their basis inverses from; searches of one problem may share one. Default: a pool of this search's own. */
  pool?: BufferPool;
  /**
   * Called now and then during the branch-and-bound (every 64 nodes) with the
   * incumbent's weight and the bound proven at the root, once there is an
   * incumbent. Default none.
   */
  onProgress?: (weight: number, lowerBound: number) => void;
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

/** Rows → columns, flattened: the columns of row r are cols[start[r] .. start[r + 1]), ascending. */
export interface RowColumns {
  start: Int32Array;
  cols: Int32Array;
}

/** The {@link RowColumns} of a problem given column by column. */
export function rowColumns(colRows: Int32Array[], rowCount: number): RowColumns {
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

/** A minimum-weight cover of the rows (or, cut short, the best found with a proven bound). */
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
  const core = new Core(
    coreRows.length,
    coreColRows,
    coreCols.map((c) => p.weight[c]!),
    cells > (p.maxCoreCells ?? 3e8),
  );
  const bb = new Search(
    core,
    p.deadline,
    p.tuning ?? DEFAULT_TUNING,
    p.pool ?? new BufferPool(),
    p.maxColumns !== undefined ? p.maxColumns - chosen.length : -1,
    p.rootOnly === true,
  );
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
  if (p.onProgress) {
    const report = p.onProgress;
    bb.onProgress = (w, lb) => report(base + w, base + lb);
  }
  if (p.incumbent) {
    const mapped = p.incumbent.filter(inCoreCol).map((c) => coreIndex[c]!);
    bb.offer(mapped);
  }
  const res = run(bb);
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
