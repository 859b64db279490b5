/**
 * Infeasibility of a covering LP, certified from the problem's own data (see
 * {@link certifiedInfeasible}): a node is pruned only on such a certificate,
 * never on the simplex's word alone.
 */
import type { CoverLp } from "./simplex";

/**
 * Whether row p of B⁻¹ proves the LP infeasible (a Farkas certificate):
 * with y that row, every point satisfies Σ_j (yᵀA_j)·x_j + Σ_i y_i·t_i = yᵀb.
 * Over the box every feasible point lies in (columns in [0, 1], a row's
 * surplus in [0, its columns − 1], the budget's in [0, K], a cut's in
 * [0, its rhs less its least value]) the left side's
 * range is computed from the problem's own data, not from the basis; when
 * yᵀb lies outside it by more than a rounding margin, no point exists. Any
 * y makes a valid certificate, so errors in B⁻¹ can only lose one.
 */
export function certifiedInfeasible(lp: CoverLp, p: number): boolean {
  const { Binv } = lp;
  const { n, cols, rowCount, rowStart } = lp;
  const y = (k: number) => Binv[p * lp.S + k]!;
  const yCard = lp.hasCard ? y(lp.card) : 0;
  let rhs = lp.hasCard ? yCard * lp.K : 0;
  for (let r = 0; r < rowCount; r++) rhs -= y(r);
  lp.cuts.forEach((cut, g) => (rhs += y(lp.cutBase + g) * cut.rhs));
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
    for (let e = lp.colCutStart[j]!; e < lp.colCutStart[j + 1]!; e++) a += lp.colCutVal[e]! * y(lp.colCutRow[e]!);
    add(a, 1);
  }
  for (let r = 0; r < rowCount; r++) add(y(r), Math.max(0, rowStart[r + 1]! - rowStart[r]! - 1));
  if (lp.hasCard) add(yCard, lp.K);
  // A cut's slack rhs − g·x lies in [0, rhs − (the least g·x over the box)].
  lp.cuts.forEach((cut, g) => {
    let least = 0;
    for (let k = 0; k < cut.val.length; k++) if (cut.val[k]! < 0) least += cut.val[k]!;
    add(y(lp.cutBase + g), Math.max(0, cut.rhs - least));
  });
  const margin = 1e-7 * (1 + scale);
  return rhs > hi + margin || rhs < lo - margin;
}
