/**
 * The cheapest bound of a node: a greedy set of independent rows (no live
 * column covers two of them), each charged its cheapest live column. Any
 * cover needs distinct columns for them, so the bound is proven.
 */
import { type Core, members } from "./core";

/** Independent-row bound and the live row with the fewest columns (the branching row). */
export function independentRows(core: Core, rowsA: Uint32Array, colsA: Uint32Array): { lb: number; branchRow: number; independent: number } {
  const rows = members(rowsA);
  const deg: number[] = [];
  for (const r of rows) deg[r] = core.rowDegree(r, colsA);
  if (rows.length === 0) return { lb: 0, branchRow: -1, independent: 0 };
  rows.sort((a, b) => deg[a]! - deg[b]!);
  const blocked = new Uint8Array(core.R);
  const tmp: number[] = [];
  let lb = 0;
  let independent = 0;
  for (const r of rows) {
    if (blocked[r]) continue;
    independent++;
    core.colsOfRow(r, colsA, tmp);
    let m = Infinity;
    for (const c of tmp) {
      if (core.w[c]! < m) m = core.w[c]!;
      const l = core.cols[c]!;
      for (let i = 0; i < l.length; i++) blocked[l[i]!] = 1;
    }
    lb += m;
  }
  return { lb, branchRow: rows[0]!, independent };
}
