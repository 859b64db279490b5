/**
 * Chvátal–Gomory cuts of the covering LP, built from its optimal tableau
 * but made exact on the problem's integer data (see {@link gomoryCuts}).
 */
import type { CoverLp, LpCut } from "./simplex";

/** Largest magnitude of a cut's coefficients and right-hand side (see {@link gomoryCuts}). */
const CUT_LIMIT = 2 ** 20;

/**
 * Chvátal–Gomory cuts from the rows of the optimal tableau whose basic
 * variable is fractional. Each row i is read as e_i(x) ≤ b_i (integer
 * data); with multipliers λ_i, the fractional parts of B⁻¹'s row rounded
 * to multiples of 2⁻²⁰, and ν_j = ⌈c_j⌉ − c_j on x_j ≤ 1 for the columns
 * at 1 (c = λA), the inequality Σ_j ⌊c_j + ν_j⌋ x_j ≤ ⌊λb + Σν⌋ holds for
 * every integer point: λ ≥ 0 and ν ≥ 0 make any choice valid, and with
 * dyadic multipliers every sum is exact in floating point (the rows'
 * numbers stay below 2^20 in magnitude: cuts with larger ones are dropped),
 * so the cut does not depend on the simplex's rounding. Returns the cuts the current
 * point violates by more than `minViolation`, most violated (per unit of
 * coefficient norm) first, at most `max`.
 */
export function gomoryCuts(lp: CoverLp, max: number, minViolation = 0.05): LpCut[] {
  const { n, M, S, Binv, xB, atUpper, pos, rowCount, rowStart, rowCols, cuts, cutBase, hasCard, card, K } = lp;
  const SCALE = 1048576;
  const x = lp.primal();
  // The rows whose basic value is most fractional first.
  const cand: number[] = [];
  for (let p = 0; p < M; p++) {
    const f = xB[p]! - Math.floor(xB[p]!);
    if (f >= 0.01 && f <= 0.99) cand.push(p);
  }
  const frac = (p: number) => Math.abs(xB[p]! - Math.floor(xB[p]!) - 0.5);
  cand.sort((a, b) => frac(a) - frac(b));
  if (cand.length > 4 * max) cand.length = 4 * max;
  const found: { cut: LpCut; score: number }[] = [];
  const c = new Float64Array(n);
  const idx = new Int32Array(n);
  const val = new Int32Array(n);
  // The columns each combination touches (bitset; the others have c = 0 and add nothing below).
  const NW = (n + 31) >>> 5;
  const mark = new Uint32Array(NW);
  // Cuts met twice are kept once, told apart by a hash (a collision can only drop a cut).
  const seenKey = new Set<number>();
  for (const p of cand) {
    // c = λA and λb, exactly (dyadic λ, integer data), over the nonzero multipliers only.
    let lb = 0;
    let any = false;
    for (let i = 0; i < M; i++) {
      const y = Binv[p * S + i]!;
      if (y === 0) continue;
      const l = Math.round((y - Math.floor(y)) * SCALE) / SCALE;
      if (l >= 1 || l < 1e-6) continue;
      any = true;
      if (i < rowCount) {
        lb -= l;
        for (let e = rowStart[i]!; e < rowStart[i + 1]!; e++) {
          const j = rowCols[e]!;
          c[j]! -= l;
          mark[j >>> 5]! |= 1 << (j & 31);
        }
      } else if (hasCard && i === card) {
        lb += l * K;
        for (let j = 0; j < n; j++) c[j]! += l;
        mark.fill(0xffffffff);
        if (n & 31) mark[NW - 1] = (1 << (n & 31)) - 1;
      } else {
        const cut = cuts[i - cutBase]!;
        lb += l * cut.rhs;
        for (let k = 0; k < cut.cols.length; k++) {
          const j = cut.cols[k]!;
          c[j]! += l * cut.val[k]!;
          mark[j >>> 5]! |= 1 << (j & 31);
        }
      }
    }
    if (!any) continue;
    let rhs = lb;
    let nnz = 0;
    let lhs = 0;
    let norm = 0;
    let hash = 0x811c9dc5;
    let big = false;
    // The touched columns in ascending order (each then cleared for the next row).
    for (let w = 0; w < NW; w++) {
      for (let bits = mark[w]!; bits !== 0; bits &= bits - 1) {
        const j = (w << 5) | (31 - Math.clz32(bits & -bits));
        let cj = c[j]!;
        c[j] = 0;
        if (atUpper[j] === 1 && pos[j]! < 0) {
          const nu = Math.ceil(cj) - cj;
          rhs += nu;
          cj += nu;
        }
        const pi = Math.floor(cj);
        if (pi > CUT_LIMIT || pi < -CUT_LIMIT) big = true;
        if (pi !== 0) {
          idx[nnz] = j;
          val[nnz++] = pi;
          lhs += pi * x[j]!;
          norm += pi * pi;
          hash = Math.imul(hash ^ j, 16777619);
          hash = Math.imul(hash ^ (pi & 0xffff), 16777619);
        }
      }
      mark[w] = 0;
    }
    if (nnz === 0) continue;
    // Sums are exact while |c|·2^20 stays below 2^53, and coefficients must fit Int32: cuts with large
    // numbers (they grow over many rounds, and make the LP ill-conditioned) are dropped.
    const r0 = Math.floor(rhs);
    if (big || r0 > CUT_LIMIT || r0 < -CUT_LIMIT) continue;
    const viol = lhs - r0;
    if (!(viol > minViolation)) continue;
    hash = Math.imul(hash ^ (r0 | 0), 16777619);
    if (seenKey.has(hash)) continue;
    seenKey.add(hash);
    found.push({ cut: { cols: idx.slice(0, nnz), val: val.slice(0, nnz), rhs: r0 }, score: viol / Math.sqrt(norm) });
  }
  found.sort((a, b) => b.score - a.score);
  return found.slice(0, max).map((f) => f.cut);
}
