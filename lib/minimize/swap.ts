/** One-for-one column swaps that keep a cover and lower its literals. */
import type { RowColumns } from "./cover";

/**
 * One-for-one swaps that keep the cover and lower its literals: a column can
 * give way to a cheaper one covering every row only it covers. Gives the
 * literal search a good first incumbent.
 */
export function swapForFewerLiterals(chosen: number[], colRows: Int32Array[], lits: number[], rowCount: number, rc: RowColumns): number[] {
  const { start, cols } = rc;
  const count = new Int32Array(rowCount);
  const cur = chosen.slice();
  const inCover = new Uint8Array(colRows.length);
  for (const c of cur) inCover[c] = 1;
  for (const c of cur) for (const r of colRows[c]!) count[r]!++;
  // The rows only the column under study covers.
  const own: number[] = [];
  // Whether column d covers every row of `own`: d among each row's columns (ascending), first miss ends it.
  const coversOwn = (d: number): boolean => {
    if (colRows[d]!.length < own.length) return false;
    for (let k = 0; k < own.length; k++) {
      const r = own[k]!;
      let q = start[r]!;
      const end = start[r + 1]!;
      while (q < end && cols[q]! < d) q++;
      if (q === end || cols[q] !== d) return false;
    }
    return true;
  };
  for (let improved = true; improved; ) {
    improved = false;
    for (let i = 0; i < cur.length; i++) {
      const c = cur[i]!;
      const rows = colRows[c]!;
      let first = 0;
      while (first < rows.length && count[rows[first]!] !== 1) first++;
      if (first === rows.length) continue;
      // A replacement covers the first own row and has fewer literals; without one, the other own rows do not matter.
      const r0 = rows[first]!;
      let some = false;
      for (let q = start[r0]!; q < start[r0 + 1]! && !some; q++) {
        const d = cols[q]!;
        some = d !== c && !inCover[d] && lits[d]! < lits[c]!;
      }
      if (!some) continue;
      own.length = 0;
      for (let k = first; k < rows.length; k++) if (count[rows[k]!] === 1) own.push(rows[k]!);
      let best = -1;
      for (let q = start[r0]!; q < start[r0 + 1]!; q++) {
        const d = cols[q]!;
        if (d === c || inCover[d] || lits[d]! >= lits[best < 0 ? c : best]!) continue;
        if (coversOwn(d)) best = d;
      }
      if (best < 0) continue;
      for (const r of colRows[c]!) count[r]!--;
      for (const r of colRows[best]!) count[r]!++;
      inCover[c] = 0;
      inCover[best] = 1;
      cur[i] = best;
      improved = true;
    }
  }
  return cur;
}
