// Reference computations the tests make themselves: brute-force implicant
// enumeration over all 3^n cubes and a minimum cover by the highs MILP solver.
import highsLoader from "highs";
import type { Cube, FunctionSpec } from "../../lib/logic";
import { fullMask, minterm, popcount } from "../../lib/logic";

/** The bench's seeded generator (mulberry32), so tests and bench draw the same functions from a seed. */
import { prng as rng } from "../../lib/bench/cases";
export { rng };

export const names = (n: number) => Array.from({ length: n }, (_, i) => `x${i}`);

export function randomSpec(n: number, outputs: number, seed: number, pOn = 0.4, pDc = 0.1): FunctionSpec {
  const r = rng(seed);
  return {
    inputs: names(n),
    outputs: Array.from({ length: outputs }, (_, j) => {
      const on: Cube[] = [];
      const dc: Cube[] = [];
      for (let m = 0; m < 2 ** n; m++) {
        const x = r();
        if (x < pOn) on.push(minterm(m, n));
        else if (x < pOn + pDc) dc.push(minterm(m, n));
      }
      return { name: `f${j}`, on, dc };
    }),
  };
}

/** Value of output j at minterm m by direct lookup in the spec's cubes: 1, 0, or null for DC. */
export function valueAt(spec: FunctionSpec, j: number, m: number): 0 | 1 | null {
  const o = spec.outputs[j]!;
  const inside = (c: Cube) => ((m ^ c.value) & c.mask) === 0;
  if (o.on.some(inside)) return 1;
  if (o.dc.some(inside)) return null;
  return 0;
}

/** Every cube over n inputs with the set of outputs in whose ON ∪ DC it lies (tag 0 dropped). */
export function bruteImplicants(spec: FunctionSpec): { cube: Cube; tag: number; on: number[][] }[] {
  const n = spec.inputs.length;
  const full = fullMask(n);
  const vals = Array.from({ length: spec.outputs.length }, (_, j) =>
    Array.from({ length: 2 ** n }, (_, m) => valueAt(spec, j, m)),
  );
  const out: { cube: Cube; tag: number; on: number[][] }[] = [];
  for (let mask = 0; mask <= full; mask++) {
    for (let value = 0; value <= full; value++) {
      if ((value & ~mask) !== 0) continue;
      let tag = 0;
      const on: number[][] = spec.outputs.map(() => []);
      for (let j = 0; j < spec.outputs.length; j++) {
        let ok = true;
        for (let m = 0; m < 2 ** n; m++) {
          if (((m ^ value) & mask) !== 0) continue;
          if (vals[j]![m] === 0) {
            ok = false;
            break;
          }
          if (vals[j]![m] === 1) on[j]!.push(m);
        }
        if (ok) tag |= 1 << j;
      }
      if (tag !== 0) out.push({ cube: { value, mask }, tag, on });
    }
  }
  return out;
}

/** Brute-force prime test: no literal can be dropped within ON ∪ DC of one output. */
export function isPrimeFor(spec: FunctionSpec, j: number, c: Cube): boolean {
  const n = spec.inputs.length;
  for (let b = 0; b < n; b++) {
    const bit = 1 << b;
    if (!(c.mask & bit)) continue;
    const up = { value: c.value & ~bit, mask: c.mask & ~bit };
    let ok = true;
    for (let m = 0; m < 2 ** n && ok; m++) if (((m ^ up.value) & up.mask) === 0 && valueAt(spec, j, m) === 0) ok = false;
    if (ok) return false;
  }
  return true;
}

let highsPromise: ReturnType<typeof highsLoader> | null = null;

/**
 * Minimum of Σ (W·[term used and of two or more literals] + literals) over all
 * multi-output implicants, every (output, ON minterm) covered by a used term
 * tagged with that output: products first, literals second (W = n·2^n·outputs + 1
 * exceeds any cover's literals). A term of one literal is a wire, not a product
 * (a gate count: common practice, no source). Solved by highs to a proven
 * optimum (no MIP gap). Returns {products, literals}.
 */
export async function milpMinimum(
  spec: FunctionSpec,
  /** Count every term as a product, a term of one literal too (the plain set-cover count of columns). */
  options: { everyTermAProduct?: boolean } = {},
): Promise<{ products: number; literals: number }> {
  highsPromise ??= highsLoader();
  const highs = await highsPromise;
  const imps = bruteImplicants(spec);
  const rows = new Map<string, number[]>();
  imps.forEach((p, i) =>
    p.on.forEach((ms, j) => {
      if (!((p.tag >>> j) & 1)) return;
      for (const m of ms) {
        const k = `${j}_${m}`;
        if (!rows.has(k)) rows.set(k, []);
        rows.get(k)!.push(i);
      }
    }),
  );
  for (let j = 0; j < spec.outputs.length; j++) {
    for (let m = 0; m < 2 ** spec.inputs.length; m++) {
      if (valueAt(spec, j, m) === 1 && !rows.has(`${j}_${m}`)) throw new Error("uncoverable row");
    }
  }
  const used = new Set<number>();
  for (const cols of rows.values()) for (const c of cols) used.add(c);
  const cols = [...used];
  if (rows.size === 0) return { products: 0, literals: 0 };
  // Products first: a product outweighs the most literals any cover can hold (n per term, at most 2^n terms per output).
  const W = spec.inputs.length * 2 ** spec.inputs.length * Math.max(1, spec.outputs.length) + 1;
  const obj = cols
    .map((i) => {
      const lits = popcount(imps[i]!.cube.mask);
      return `${(lits >= 2 || options.everyTermAProduct ? W : 0) + lits} y${i}`;
    })
    .join(" + ");
  let k = 0;
  const cons = [...rows.values()].map((cs) => ` r${k++}: ${cs.map((i) => `y${i}`).join(" + ")} >= 1`);
  const lp = `Minimize\n obj: ${obj}\nSubject To\n${cons.join("\n")}\nBinary\n ${cols.map((i) => `y${i}`).join(" ")}\nEnd\n`;
  // No relative or absolute MIP gap: the default relative gap (1e-4) would allow a non-minimum at these objective sizes.
  const res = highs.solve(lp, { output_flag: false, mip_rel_gap: 0, mip_abs_gap: 0.5 });
  if (res.Status !== "Optimal") throw new Error(`MILP status ${res.Status}`);
  const v = Math.round(res.ObjectiveValue);
  return { products: Math.floor(v / W), literals: v % W };
}

/**
 * Single-output minimum under the gate-inputs model (Σ literals + 1 per term) or the
 * fan-in model (AND gates ceil((k-1)/(F-1)) per term plus OR gates ceil((t-1)/(F-1)),
 * the latter as an integer variable z with (F-1)·z ≥ t - 1), by highs over all implicants.
 */
export async function milpModelMinimum(spec: FunctionSpec, model: { kind: "gate-inputs" } | { kind: "fan-in"; fanIn: number }): Promise<number> {
  highsPromise ??= highsLoader();
  const highs = await highsPromise;
  const imps = bruteImplicants(spec).filter((p) => p.tag & 1 && p.on[0]!.length > 0);
  const rows = new Map<number, number[]>();
  imps.forEach((p, i) => {
    for (const m of p.on[0]!) {
      if (!rows.has(m)) rows.set(m, []);
      rows.get(m)!.push(i);
    }
  });
  if (rows.size === 0) return 0;
  const gates = (k: number, F: number) => (k <= 1 ? 0 : Math.ceil((k - 1) / (F - 1)));
  const w = imps.map((p) => {
    const k = popcount(p.cube.mask);
    return model.kind === "gate-inputs" ? k + 1 : gates(k, model.fanIn);
  });
  const ys = imps.map((_, i) => `y${i}`);
  let obj = imps.map((_, i) => `${w[i]} y${i}`).join(" + ");
  const cons = [...rows.values()].map((cs, k) => ` r${k}: ${cs.map((i) => `y${i}`).join(" + ")} >= 1`);
  let generals = "";
  if (model.kind === "fan-in") {
    obj += " + 1 z";
    cons.push(` orgates: ${model.fanIn - 1} z - ${ys.join(" - ")} >= -1`);
    generals = "General\n z\n";
  }
  const lp = `Minimize\n obj: ${obj}\nSubject To\n${cons.join("\n")}\nBounds\n z >= 0\n${generals}Binary\n ${ys.join(" ")}\nEnd\n`;
  const res = highs.solve(model.kind === "fan-in" ? lp : lp.replace("Bounds\n z >= 0\n", ""), { output_flag: false, mip_rel_gap: 0, mip_abs_gap: 0.5 });
  if (res.Status !== "Optimal") throw new Error(`MILP status ${res.Status}`);
  return Math.round(res.ObjectiveValue);
}
