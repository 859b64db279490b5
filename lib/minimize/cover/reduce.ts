/** The reductions at a node: essential columns, column dominance and row dominance, until nothing changes. */
import type { Search } from "./state";

/**
 * Essentials, column dominance and row dominance until nothing changes.
 * Returns the weight of the columns taken, or -1 when some row can no longer be covered.
 */
export function reduce(s: Search, rowsA: Uint32Array, colsA: Uint32Array, picked: number[], dominance = 3): number {
  const core = s.core;
  let added = 0;
  const WR = core.WR;
  const WC = core.WC;
  const { bufC, bufR, dirtyEss, dirtyRow, dirtyCol } = s;
  const rowColsS = core.rowColsS;
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
    if (Date.now() > s.deadline) {
      s.aborted = true;
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
        const l = core.rowColsS[r]!;
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
          added += core.w[only]!;
          // The columns of the rows it covers lose rows.
          const rs = core.cols[only]!;
          for (let i = 0; i < rs.length; i++) if ((rowsA[rs[i]! >>> 5]! >>> (rs[i]! & 31)) & 1) colsOfRowChanged(rs[i]!);
          core.take(only, rowsA, colsA);
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
        const nr = core.rowsOfColInto(c1, rowsA, bufR);
        if (nr === 0) {
          colsA[k]! &= ~b;
          changed = true;
          continue;
        }
        const nc = core.colsOfRowInto(bufR[0]!, colsA, bufC);
        for (let q = 0; q < nc; q++) {
          const c2 = bufC[q]!;
          if (c2 === c1 || core.w[c2]! > core.w[c1]!) continue;
          let subset = true;
          for (let i = 1; i < nr; i++) {
            const r = bufR[i]!;
            if (!((core.rowBits[r * WC + (c2 >>> 5)]! >>> (c2 & 31)) & 1)) {
              subset = false;
              break;
            }
          }
          if (!subset) continue;
          if (core.w[c2] === core.w[c1] && c2 > c1 && core.colCount(c2, rowsA) === nr) continue;
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
        const nc = core.colsOfRowInto(r1, colsA, bufC);
        if (nc === 0) return -1;
        // Rows sharing r1's first column are the only candidates.
        const nr = core.rowsOfColInto(bufC[0]!, rowsA, bufR);
        for (let q = 0; q < nr; q++) {
          const r2 = bufR[q]!;
          if (r2 === r1) continue;
          let subset = true;
          for (let i = 1; i < nc; i++) {
            const c = bufC[i]!;
            if (!((core.colBits[c * WR + (r2 >>> 5)]! >>> (r2 & 31)) & 1)) {
              subset = false;
              break;
            }
          }
          if (!subset) continue;
          if (r2 < r1 && core.rowDegree(r2, colsA) === nc) continue;
          rowsA[r2 >>> 5]! &= ~(1 << (r2 & 31));
          colsOfRowChanged(r2);
          changed = true;
        }
      }
    }
  }
  return added;
}
