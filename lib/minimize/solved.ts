/** What a route hands back to minimize(): the covers, their cost and proven bounds. */
import type { Cube } from "../logic";
import type { CostModel } from "./types";

export interface Solved {
  /** Per output, the product cubes of the covered function (before POS inversion). */
  covers: Cube[][];
  /** costOfCovers of `covers`. */
  cost: number;
  exact: boolean;
  designBound: number;
  outputBounds: number[];
  primes: number;
  route: "exact" | "heuristic";
}

/**
 * Whether a cost that meets a proven bound proves the cover minimum. Under
 * "products, then literals" the bounds count products only, so meeting one
 * says nothing of the literals: only the exact route's two-phase search, run
 * to its end, proves that model.
 */
export function boundProves(model: CostModel, cost: number, bound: number): boolean {
  return model.kind !== "products" && cost === bound;
}
