/**
 * The problem actually covered: per output, the points to cover (ON, or OFF
 * for the product-of-sums form) and the don't-cares, as cube lists and, up
 * to TRUTH_TABLE_MAX_INPUTS inputs, as truth tables.
 */
import type { Cube, FunctionSpec } from "../logic";
import { TRUTH_TABLE_MAX_INPUTS, fullMask, tableFromCubes, tableMinterms } from "../logic";
import { complement } from "./unate";

/** The problem actually covered: per output, the points to cover (ON, or OFF for POS) and DC. */
export interface Target {
  on: Cube[];
  dc: Cube[];
  /** Present when inputs ≤ TRUTH_TABLE_MAX_INPUTS. `on` wins where both are set. */
  onT?: Uint32Array;
  dcT?: Uint32Array;
}

function tableCubes(t: Uint32Array, n: number): Cube[] {
  const full = fullMask(n);
  return tableMinterms(t, n).map((m) => ({ value: m, mask: full }));
}

export function buildTargets(spec: FunctionSpec, form: "sop" | "pos"): Target[] {
  const n = spec.inputs.length;
  return spec.outputs.map((o) => {
    if (n <= TRUTH_TABLE_MAX_INPUTS) {
      const on = tableFromCubes(o.on, n);
      const dc = tableFromCubes(o.dc, n);
      for (let w = 0; w < on.length; w++) dc[w]! &= ~on[w]!;
      if (form === "sop") return { on: o.on, dc: o.dc, onT: on, dcT: dc };
      const off = new Uint32Array(on.length);
      const valid = n >= 5 ? 0xffffffff : (2 ** (2 ** n) - 1) >>> 0;
      for (let w = 0; w < on.length; w++) off[w] = ~(on[w]! | dc[w]!) & valid;
      return { on: tableCubes(off, n), dc: tableCubes(dc, n), onT: off, dcT: dc };
    }
    if (form === "sop") return { on: o.on, dc: o.dc };
    return { on: complement(o.on.concat(o.dc), fullMask(n)), dc: o.dc };
  });
}
