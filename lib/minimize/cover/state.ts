/**
 * The state of one cover search: the core it works on, its settings, the
 * incumbent, what the root found (bound, cuts, reductions), and scratch
 * buffers the stages reuse from node to node.
 */
import type { BufferPool, LpCut } from "../lp";
import type { Core } from "./core";
import type { CoverTuning } from "./tuning";

/** Cuts over core columns with the root they were found at (live columns as a bitset, taken columns ascending). */
export interface CorePool {
  cuts: LpCut[];
  live: Uint32Array;
  taken: number[];
}

export class Search {
  /** The incumbent: the best cover found (core columns) and its weight. */
  best = Infinity;
  bestChosen: number[] = [];
  /** Set when the deadline passed: the search then unwinds, and nothing it did not finish is proven. */
  aborted = false;
  nodes = 0;
  /** Cuts found at the root, over core columns: valid for every cover the search considers. */
  readonly cuts: LpCut[] = [];
  /** The root's live columns and taken columns after its reductions (what the cuts assume). */
  rootLive = new Uint32Array(0);
  rootTaken: number[] = [];
  /** Cuts of an earlier search over the same core, with the root they hold at. */
  cutsIn: CorePool | null = null;
  /** Best bound proven at the root of the search (kept for a search cut short). */
  rootBound = -Infinity;
  /** Where the search reports its incumbent's weight and root bound now and then (see CoverProblem.onProgress). */
  onProgress: ((weight: number, lowerBound: number) => void) | null = null;

  /** Scratch of the Lagrangian steps: live rows of the live columns (CSR), reduced costs, subgradient. */
  csr = new Int32Array(0);
  rcBuf = new Float64Array(0);
  gBuf = new Float64Array(0);
  /** Scratch lists of columns and rows for the reductions. */
  readonly bufC: Int32Array;
  readonly bufR: Int32Array;
  /**
   * For the reductions: rows whose columns and columns whose rows changed since their last test (essential,
   * row dominance, column dominance). Sets only shrink, so a test that found nothing finds nothing again until then.
   */
  readonly dirtyEss: Uint8Array;
  readonly dirtyRow: Uint8Array;
  readonly dirtyCol: Uint8Array;

  /** Every column weighs the same: a cover of fewest columns is sought. */
  readonly unicost: boolean;

  constructor(
    readonly core: Core,
    /** Date.now() milliseconds after which the search stops. */
    readonly deadline: number,
    readonly tuning: CoverTuning,
    /** Where the node LPs' basis inverses come from. */
    readonly pool: BufferPool,
    /** Column budget of the core, or -1 for none. */
    readonly card: number,
    /** Stop after the root's reductions and LP (see CoverProblem.rootOnly). */
    readonly rootOnly: boolean,
  ) {
    const C = core.cols.length;
    const R = core.R;
    this.bufC = new Int32Array(C);
    this.bufR = new Int32Array(R);
    this.dirtyEss = new Uint8Array(R);
    this.dirtyRow = new Uint8Array(R);
    this.dirtyCol = new Uint8Array(C);
    this.unicost = core.w.every((x) => x === core.w[0]);
  }

  /** Passes the incumbent and the root's bound to onProgress, once there is an incumbent. */
  report(): void {
    if (this.onProgress && this.best < Infinity) this.onProgress(this.best, Math.min(this.best, Math.max(0, this.rootBound)));
  }

  /** Offers a known cover of the core as incumbent. */
  offer(chosen: number[]): void {
    const covered = new Uint8Array(this.core.R);
    for (const c of chosen) for (const r of this.core.cols[c]!) covered[r] = 1;
    if (!covered.every((x) => x === 1)) return;
    if (this.card >= 0 && chosen.length > this.card) return;
    const w = chosen.reduce((a, c) => a + this.core.w[c]!, 0);
    if (w < this.best) {
      this.best = w;
      this.bestChosen = chosen.slice();
    }
  }
}
