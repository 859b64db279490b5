import type { CostModel } from "./types";

/** Scale that keeps "products first, literals second" lexicographic in one integer. */
export const PRODUCT_WEIGHT = 2 ** 21;

/**
 * Whether a term of this many literals needs a gate of its own. A product of
 * one literal is a wire (or an inverter, when the literal is complemented and
 * complements are not at hand), and a product of none is the constant 1: the
 * products model counts neither among the products.
 */
export function needsGate(literals: number): boolean {
  return literals >= 2;
}

/** Gates of at most `fanIn` inputs needed to combine k signals (0 when k ≤ 1). */
export function gatesFor(k: number, fanIn: number): number {
  return k <= 1 ? 0 : Math.ceil((k - 1) / (fanIn - 1));
}

/**
 * Integer weight of one distinct term in the covering problem. For the models
 * with OR-plane costs the weight includes one connection (every chosen term
 * serves at least one output), which makes the covering optimum a lower bound
 * on the true cost; see {@link boundFromSurrogate}.
 */
export function columnWeight(model: CostModel, literals: number): number {
  switch (model.kind) {
    case "products":
      return (needsGate(literals) ? PRODUCT_WEIGHT : 0) + literals;
    case "gate-inputs":
      return literals + 1;
    case "fan-in":
      // Scaled by (fanIn - 1) so that the 1/(fanIn-1) share of an OR gate stays integral.
      return (model.fanIn - 1) * gatesFor(literals, model.fanIn) + 1;
  }
}

/** True cost of a design under the model: its distinct terms and, per output, its term count. */
export function designCost(model: CostModel, distinctLiterals: number[], termsPerOutput: number[]): number {
  switch (model.kind) {
    case "products": {
      let products = 0;
      for (const l of distinctLiterals) if (needsGate(l)) products++;
      return products;
    }
    case "gate-inputs":
      return distinctLiterals.reduce((a, b) => a + b, 0) + termsPerOutput.reduce((a, b) => a + b, 0);
    case "fan-in": {
      let g = 0;
      for (const l of distinctLiterals) g += gatesFor(l, model.fanIn);
      for (const t of termsPerOutput) g += gatesFor(t, model.fanIn);
      return g;
    }
  }
}

/**
 * Turns a lower bound on the covering weight (sum of {@link columnWeight}) into
 * a lower bound on {@link designCost}. `liveOutputs` counts outputs that need
 * at least one term.
 */
export function boundFromSurrogate(model: CostModel, weightBound: number, liveOutputs: number): number {
  switch (model.kind) {
    case "products":
      return Math.floor(weightBound / PRODUCT_WEIGHT);
    case "gate-inputs":
      return weightBound;
    case "fan-in":
      // Σ gates(t_j) ≥ Σ (t_j - 1)/(F-1) ≥ (#terms - liveOutputs)/(F-1).
      return Math.max(0, Math.ceil((weightBound - liveOutputs) / (model.fanIn - 1) - 1e-9));
  }
}

export function validateModel(model: CostModel): void {
  if (model.kind === "fan-in" && !(Number.isInteger(model.fanIn) && model.fanIn >= 2)) {
    throw new RangeError(`fan-in must be a whole number of at least 2; got ${model.fanIn}`);
  }
}
