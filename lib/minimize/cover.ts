/**
 * Minimum-weight cover of (output, ON-minterm) rows by multi-output primes.
 *
 * Essential primes are taken on the sparse matrix first; the remaining cyclic
 * core goes into bitsets, where row dominance, column dominance and
 * essentials are applied at every node of a branch-and-bound. The bound at a
 * node is a greedy set of independent rows (no live column covers two of
 * them), each charged its cheapest live column: any cover needs distinct
 * columns for them, so the bound is proven.
 */
import { ExactLimit } from "./primes";

export interface CoverProblem {
  /** rows[c] = row indices covered by column c. */
  colRows: Int32Array[];
  weight: number[];
  rowCount: number;
  deadline: number;
  /** Core size (rows × columns) above which the exact search is not attempted. */
  maxCoreCells?: number;
}

export interface CoverSolution {
  chosen: number[];
  weight: number;
  /** Proven lower bound on the minimum weight. */
  lowerBound: number;
  exact: boolean;
}

function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

export function solveCover(p: CoverProblem): CoverSolution {
  const C = p.colRows.length;
  const R = p.rowCount;
  const rowCols: number[][] = Array.from({ length: R }, () => []);
  for (let c = 0; c < C; c++) for (const r of p.colRows[c]!) rowCols[r]!.push(c);
  for (let r = 0; r < R; r++) {
    if (rowCols[r]!.length === 0) throw new Error(`internal: row ${r} has no covering prime`);
  }
  // Sparse essentials, repeated: taking an essential can make no new essentials
  // without column removal, so one pass suffices here.
  const covered = new Uint8Array(R);
  const chosen: number[] = [];
  const taken = new Uint8Array(C);
  let base = 0;
  for (let r = 0; r < R; r++) {
    if (covered[r] || rowCols[r]!.length !== 1) continue;
    const c = rowCols[r]![0]!;
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
  coreRows.forEach((r, i) => (rowMap[r] = i));
  const coreCols: number[] = [];
  for (let c = 0; c < C; c++) {
    if (taken[c]) continue;
    if (p.colRows[c]!.some((r) => rowMap[r]! >= 0)) coreCols.push(c);
  }
  const cells = coreRows.length * coreCols.length;
  if (cells > (p.maxCoreCells ?? 4e7)) throw new ExactLimit("implicants", cells);
  const bb = new BranchAndBound(
    coreRows.length,
    coreCols.map((c) => Int32Array.from(p.colRows[c]!.filter((r) => rowMap[r]! >= 0).map((r) => rowMap[r]!))),
    coreCols.map((c) => p.weight[c]!),
    p.deadline,
  );
  const res = bb.run();
  for (const c of res.chosen) chosen.push(coreCols[c]!);
  return { chosen, weight: base + res.weight, lowerBound: base + res.lowerBound, exact: res.exact };
}

class BranchAndBound {
  readonly WR: number;
  readonly WC: number;
  readonly colBits: Uint32Array;
  readonly rowBits: Uint32Array;
  best = Infinity;
  bestChosen: number[] = [];
  aborted = false;
  nodes = 0;

  constructor(
    readonly R: number,
    readonly cols: Int32Array[],
    readonly w: number[],
    readonly deadline: number,
  ) {
    const C = cols.length;
    this.WR = (R + 31) >>> 5;
    this.WC = (C + 31) >>> 5;
    this.colBits = new Uint32Array(C * this.WR);
    this.rowBits = new Uint32Array(R * this.WC);
    for (let c = 0; c < C; c++) {
      for (const r of cols[c]!) {
        this.colBits[c * this.WR + (r >>> 5)]! |= 1 << (r & 31);
        this.rowBits[r * this.WC + (c >>> 5)]! |= 1 << (c & 31);
      }
    }
  }

  run(): { chosen: number[]; weight: number; lowerBound: number; exact: boolean } {
    const rowsA = new Uint32Array(this.WR);
    for (let r = 0; r < this.R; r++) rowsA[r >>> 5]! |= 1 << (r & 31);
    const colsA = new Uint32Array(this.WC);
    for (let c = 0; c < this.cols.length; c++) colsA[c >>> 5]! |= 1 << (c & 31);
    this.greedy(rowsA, colsA);
    const picked: number[] = [];
    const rootRows = rowsA.slice();
    const rootCols = colsA.slice();
    const add = this.reduce(rootRows, rootCols, picked);
    const rootBound = add + this.bound(rootRows, rootCols).lb;
    this.search(rowsA, colsA, 0, []);
    const exact = !this.aborted;
    return {
      chosen: this.bestChosen,
      weight: this.best,
      lowerBound: exact ? this.best : Math.min(this.best, rootBound),
      exact,
    };
  }

  private colsOfRow(r: number, colsA: Uint32Array, out: number[]): void {
    out.length = 0;
    const base = r * this.WC;
    for (let k = 0; k < this.WC; k++) {
      let x = this.rowBits[base + k]! & colsA[k]!;
      while (x !== 0) {
        const b = x & -x;
        out.push(k * 32 + 31 - Math.clz32(b));
        x ^= b;
      }
    }
  }

  private rowDegree(r: number, colsA: Uint32Array): number {
    const base = r * this.WC;
    let d = 0;
    for (let k = 0; k < this.WC; k++) d += popcount(this.rowBits[base + k]! & colsA[k]!);
    return d;
  }

  private colCount(c: number, rowsA: Uint32Array): number {
    const base = c * this.WR;
    let d = 0;
    for (let k = 0; k < this.WR; k++) d += popcount(this.colBits[base + k]! & rowsA[k]!);
    return d;
  }

  private take(c: number, rowsA: Uint32Array, colsA: Uint32Array): void {
    const base = c * this.WR;
    for (let k = 0; k < this.WR; k++) rowsA[k]! &= ~this.colBits[base + k]!;
    colsA[c >>> 5]! &= ~(1 << (c & 31));
  }

  /** Greedy cover (weight per newly covered row), then redundant columns dropped: the first incumbent. */
  private greedy(rowsA0: Uint32Array, colsA0: Uint32Array): void {
    const rowsA = rowsA0.slice();
    const colsA = colsA0.slice();
    const chosen: number[] = [];
    for (;;) {
      let any = false;
      for (let k = 0; k < this.WR; k++) if (rowsA[k] !== 0) any = true;
      if (!any) break;
      let bestC = -1;
      let bestScore = -1;
      for (let c = 0; c < this.cols.length; c++) {
        if (!((colsA[c >>> 5]! >>> (c & 31)) & 1)) continue;
        const cnt = this.colCount(c, rowsA);
        if (cnt === 0) continue;
        const score = cnt / this.w[c]!;
        if (score > bestScore) {
          bestScore = score;
          bestC = c;
        }
      }
      if (bestC < 0) return;
      chosen.push(bestC);
      this.take(bestC, rowsA, colsA);
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
  private reduce(rowsA: Uint32Array, colsA: Uint32Array, picked: number[]): number {
    let added = 0;
    const tmp: number[] = [];
    const tmp2: number[] = [];
    const WR = this.WR;
    const WC = this.WC;
    for (let changed = true; changed; ) {
      changed = false;
      // Essentials.
      for (let k = 0; k < WR; k++) {
        let x = rowsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const r = k * 32 + 31 - Math.clz32(b);
          if (!((rowsA[k]! >>> (r & 31)) & 1)) continue;
          this.colsOfRow(r, colsA, tmp);
          if (tmp.length === 0) return -1;
          if (tmp.length === 1) {
            const c = tmp[0]!;
            picked.push(c);
            added += this.w[c]!;
            this.take(c, rowsA, colsA);
            x &= rowsA[k]!;
            changed = true;
          }
        }
      }
      // Column dominance: c1 goes when some c2 covers all its live rows at no greater weight.
      for (let k = 0; k < WC; k++) {
        let x = colsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const c1 = k * 32 + 31 - Math.clz32(b);
          const b1 = c1 * WR;
          let first = -1;
          for (let q = 0; q < WR; q++) {
            const y = this.colBits[b1 + q]! & rowsA[q]!;
            if (y !== 0) {
              first = q * 32 + 31 - Math.clz32(y & -y);
              break;
            }
          }
          if (first < 0) {
            colsA[k]! &= ~b;
            changed = true;
            continue;
          }
          this.colsOfRow(first, colsA, tmp);
          for (const c2 of tmp) {
            if (c2 === c1 || this.w[c2]! > this.w[c1]!) continue;
            const b2 = c2 * WR;
            let subset = true;
            let equal = true;
            for (let q = 0; q < WR; q++) {
              const y1 = this.colBits[b1 + q]! & rowsA[q]!;
              const y2 = this.colBits[b2 + q]! & rowsA[q]!;
              if ((y1 & ~y2) !== 0) {
                subset = false;
                break;
              }
              if (y1 !== y2) equal = false;
            }
            if (!subset) continue;
            if (equal && this.w[c2] === this.w[c1] && c2 > c1) continue;
            colsA[k]! &= ~b;
            changed = true;
            break;
          }
        }
      }
      // Row dominance: a row whose live columns include another row's live columns goes.
      for (let k = 0; k < WR; k++) {
        let x = rowsA[k]!;
        while (x !== 0) {
          const b = x & -x;
          x ^= b;
          const r1 = k * 32 + 31 - Math.clz32(b);
          if (!((rowsA[k]! >>> (r1 & 31)) & 1)) continue;
          this.colsOfRow(r1, colsA, tmp);
          if (tmp.length === 0) return -1;
          // Rows sharing r1's first column are the only candidates.
          const c = tmp[0]!;
          const cb = c * WR;
          tmp2.length = 0;
          for (let q = 0; q < WR; q++) {
            let y = this.colBits[cb + q]! & rowsA[q]!;
            while (y !== 0) {
              const bb = y & -y;
              y ^= bb;
              tmp2.push(q * 32 + 31 - Math.clz32(bb));
            }
          }
          const rb1 = r1 * WC;
          for (const r2 of tmp2) {
            if (r2 === r1) continue;
            const rb2 = r2 * WC;
            let subset = true;
            let equal = true;
            for (let q = 0; q < WC; q++) {
              const y1 = this.rowBits[rb1 + q]! & colsA[q]!;
              const y2 = this.rowBits[rb2 + q]! & colsA[q]!;
              if ((y1 & ~y2) !== 0) {
                subset = false;
                break;
              }
              if (y1 !== y2) equal = false;
            }
            if (!subset || (equal && r2 < r1)) continue;
            rowsA[r2 >>> 5]! &= ~(1 << (r2 & 31));
            changed = true;
          }
        }
      }
    }
    return added;
  }

  /** Independent-row bound and the live row with the fewest columns (the branching row). */
  private bound(rowsA: Uint32Array, colsA: Uint32Array): { lb: number; branchRow: number } {
    const rows: number[] = [];
    const deg: number[] = [];
    for (let k = 0; k < this.WR; k++) {
      let x = rowsA[k]!;
      while (x !== 0) {
        const b = x & -x;
        x ^= b;
        const r = k * 32 + 31 - Math.clz32(b);
        rows.push(r);
        deg[r] = this.rowDegree(r, colsA);
      }
    }
    if (rows.length === 0) return { lb: 0, branchRow: -1 };
    rows.sort((a, b) => deg[a]! - deg[b]!);
    const blocked = new Uint32Array(this.WR);
    const tmp: number[] = [];
    let lb = 0;
    for (const r of rows) {
      if ((blocked[r >>> 5]! >>> (r & 31)) & 1) continue;
      this.colsOfRow(r, colsA, tmp);
      let m = Infinity;
      for (const c of tmp) {
        if (this.w[c]! < m) m = this.w[c]!;
        const cb = c * this.WR;
        for (let q = 0; q < this.WR; q++) blocked[q]! |= this.colBits[cb + q]!;
      }
      lb += m;
    }
    return { lb, branchRow: rows[0]! };
  }

  private search(rowsA: Uint32Array, colsA: Uint32Array, cost: number, chosen: number[]): void {
    if (this.aborted) return;
    if ((++this.nodes & 63) === 0 && Date.now() > this.deadline) {
      this.aborted = true;
      return;
    }
    const picked: number[] = [];
    const add = this.reduce(rowsA, colsA, picked);
    if (add < 0) return;
    cost += add;
    const here = picked.length ? chosen.concat(picked) : chosen;
    const { lb, branchRow } = this.bound(rowsA, colsA);
    if (branchRow < 0) {
      if (cost < this.best) {
        this.best = cost;
        this.bestChosen = here.slice();
      }
      return;
    }
    if (cost + lb >= this.best) return;
    const cand: number[] = [];
    this.colsOfRow(branchRow, colsA, cand);
    const score = new Map<number, number>();
    for (const c of cand) score.set(c, this.colCount(c, rowsA) / this.w[c]!);
    cand.sort((a, b) => score.get(b)! - score.get(a)!);
    const cols = colsA.slice();
    for (const c of cand) {
      const r2 = rowsA.slice();
      const c2 = cols.slice();
      this.take(c, r2, c2);
      here.push(c);
      this.search(r2, c2, cost + this.w[c]!, here);
      here.pop();
      if (this.aborted) return;
      // Later branches exclude the columns already explored at this node.
      cols[c >>> 5]! &= ~(1 << (c & 31));
    }
  }
}
