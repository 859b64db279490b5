/**
 * The cyclic core of a covering problem as the search sees it: each column's
 * rows and each row's columns, as sparse lists and (unless too big) as
 * bitsets both ways. A node is a pair of bitsets, its live rows and live
 * columns; the queries below read liveness from them.
 */

/** The indices of the set bits of a bitset, ascending. */
export function members(words: Uint32Array): number[] {
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

export class Core {
  /** Words of a row bitset and of a column bitset. */
  readonly WR: number;
  readonly WC: number;
  /** Column c's rows at colBits[c * WR ..], row r's columns at rowBits[r * WC ..] (empty when sparseOnly). */
  readonly colBits: Uint32Array;
  readonly rowBits: Uint32Array;
  /** Static sparse lists of each row's columns, ascending; liveness is read from the node's bitsets. */
  readonly rowColsS: Int32Array[];
  /** Nonzeros of the matrix. */
  readonly nnz: number;

  constructor(
    readonly R: number,
    /** cols[c]: the rows of column c. */
    readonly cols: Int32Array[],
    readonly w: number[],
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
    this.nnz = nnz;
  }

  /** The live columns of row r into `out`; returns how many. */
  colsOfRowInto(r: number, colsA: Uint32Array, out: Int32Array): number {
    const l = this.rowColsS[r]!;
    let n = 0;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      if ((colsA[c >>> 5]! >>> (c & 31)) & 1) out[n++] = c;
    }
    return n;
  }

  /** The live rows of column c into `out`; returns how many. */
  rowsOfColInto(c: number, rowsA: Uint32Array, out: Int32Array): number {
    const l = this.cols[c]!;
    let n = 0;
    for (let i = 0; i < l.length; i++) {
      const r = l[i]!;
      if ((rowsA[r >>> 5]! >>> (r & 31)) & 1) out[n++] = r;
    }
    return n;
  }

  /** {@link colsOfRowInto} into an array, for the callers that keep or sort the list (a direct loop: this is hot in the bounds). */
  colsOfRow(r: number, colsA: Uint32Array, out: number[]): void {
    out.length = 0;
    const l = this.rowColsS[r]!;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      if ((colsA[c >>> 5]! >>> (c & 31)) & 1) out.push(c);
    }
  }

  /** Live columns of row r. */
  rowDegree(r: number, colsA: Uint32Array): number {
    const l = this.rowColsS[r]!;
    let d = 0;
    for (let i = 0; i < l.length; i++) {
      const c = l[i]!;
      d += (colsA[c >>> 5]! >>> (c & 31)) & 1;
    }
    return d;
  }

  /** Live rows of column c. */
  colCount(c: number, rowsA: Uint32Array): number {
    const l = this.cols[c]!;
    let d = 0;
    for (let i = 0; i < l.length; i++) {
      const r = l[i]!;
      d += (rowsA[r >>> 5]! >>> (r & 31)) & 1;
    }
    return d;
  }

  /** Takes column c at a node: its rows are covered, and it is no longer live. */
  take(c: number, rowsA: Uint32Array, colsA: Uint32Array): void {
    const base = c * this.WR;
    for (let k = 0; k < this.WR; k++) rowsA[k]! &= ~this.colBits[base + k]!;
    colsA[c >>> 5]! &= ~(1 << (c & 31));
  }
}
