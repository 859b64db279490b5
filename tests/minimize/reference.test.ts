import { describe, expect, it } from "vitest";
import { cubeFromString, cubeToString, minterm, type FunctionSpec } from "../../lib/logic";
import { LimitError, minimize } from "../../lib/minimize";
import { verifyCovers } from "../../lib/verify";
import { milpMinimum } from "./helpers";

const spec1 = (n: number, on: number[], dc: number[] = [], inputs = ["a", "b", "c", "d"].slice(0, n)): FunctionSpec => ({
  inputs,
  outputs: [{ name: "f", on: on.map((m) => minterm(m, n)), dc: dc.map((m) => minterm(m, n)) }],
});

describe("worked examples", () => {
  it("Σm(4,8,10,11,12,15) + d(9,14) needs 3 products and 7 literals", () => {
    // Source: Wikipedia, "Quine–McCluskey algorithm", worked example (f = BC'D' + AB' + AC).
    const r = minimize(spec1(4, [4, 8, 10, 11, 12, 15], [9, 14]));
    expect(r.outputs[0]!.products).toBe(3);
    expect(r.outputs[0]!.literals).toBe(7);
    expect(r.exact).toBe(true);
    // Source: same article — the minimum cover uses the essential primes BC'D' and AC plus one of AB', AD'.
    const cubes = r.outputs[0]!.cubes.map((c) => cubeToString(c, 4));
    expect(cubes).toContain("-100");
    expect(cubes).toContain("1-1-");
  });

  it("cyclic Σm(0,1,2,5,6,7) needs 3 products and 6 literals", () => {
    // Source: Wikipedia, "Petrick's method", example (two minimum covers of 3 two-literal products).
    const r = minimize(spec1(3, [0, 1, 2, 5, 6, 7]));
    expect(r.outputs[0]!.products).toBe(3);
    expect(r.outputs[0]!.literals).toBe(6);
    expect(r.exact).toBe(true);
    expect(r.lowerBound).toBe(3);
  });

  it("the heuristic on the cyclic example stays within its proven bound", () => {
    // Source: Wikipedia, "Petrick's method": the minimum is 3 products.
    const r = minimize(spec1(3, [0, 1, 2, 5, 6, 7]), { heuristic: true });
    expect(r.outputs[0]!.products).toBeGreaterThanOrEqual(3);
    expect(r.lowerBound).toBeLessThanOrEqual(3);
    expect(r.route).toBe("heuristic");
  });

  it("BCD to excess-3 with don't-cares 10..15 shares terms across its four outputs", async () => {
    // From memory (common digital design textbook example): the separately minimized
    // outputs are w = a + b*c + b*d, x = b'*c + b'*d + b*c'*d', y = c*d + c'*d', z = d'.
    const on: number[][] = [[], [], [], []];
    for (let v = 0; v <= 9; v++) {
      const e = v + 3;
      for (let j = 0; j < 4; j++) if ((e >> (3 - j)) & 1) on[j]!.push(v);
    }
    const dc = [10, 11, 12, 13, 14, 15];
    const spec: FunctionSpec = {
      inputs: ["a", "b", "c", "d"],
      outputs: ["w", "x", "y", "z"].map((name, j) => ({ name, on: on[j]!.map((m) => minterm(m, 4)), dc: dc.map((m) => minterm(m, 4)) })),
    };
    const r = minimize(spec);
    expect(r.exact).toBe(true);
    // From memory: separately the outputs need 3 + 3 + 2 + 1 = 9 products; sharing cannot need more.
    expect(r.cost).toBeLessThanOrEqual(9);
    // Brute force by the test (all implicants, highs MILP): the shared minimum.
    const ref = await milpMinimum(spec);
    expect(r.cost).toBe(ref.products);
    expect(r.outputs[3]!.products).toBeGreaterThanOrEqual(1);
    expect(verifyCovers(spec, r.outputs.map((o) => ({ form: o.form, cubes: o.cubes }))).ok).toBe(true);
  });

  it("POS form of the Wikipedia example is verified and uses sum terms", () => {
    // Source: Wikipedia QM example function; its complement Σm(0..3,5,6,7,13) ... checked by verification, not by value.
    const spec = spec1(4, [4, 8, 10, 11, 12, 15], [9, 14]);
    const r = minimize(spec, { form: "pos" });
    const o = r.outputs[0]!;
    expect(o.form).toBe("pos");
    expect(o.expression.startsWith("(")).toBe(true);
    expect(verifyCovers(spec, [{ form: "pos", cubes: o.cubes }]).ok).toBe(true);
  });

  it("constant outputs print 0 and 1", () => {
    // Common practice, no source: an empty ON-set is 0; an ON-set of every point is 1.
    const spec: FunctionSpec = {
      inputs: ["a", "b"],
      outputs: [
        { name: "z", on: [], dc: [] },
        { name: "o", on: [cubeFromString("--")], dc: [] },
      ],
    };
    const r = minimize(spec);
    expect(r.outputs[0]!.expression).toBe("0");
    expect(r.outputs[1]!.expression).toBe("1");
  });

  it("expressions use the language's operators", () => {
    // Our language (docs/PRODUCT.md fixed core): AND '*', OR '+', postfix ' for NOT.
    const r = minimize(spec1(2, [1], [], ["p", "q"]));
    expect(r.outputs[0]!.expression).toBe("p' * q");
  });

  it("the fan-in model prices splits of wide products", () => {
    // Common practice, no source: a 4-input AND from 2-input gates needs 3 gates; f = abcd alone costs 3.
    const r = minimize(spec1(4, [15]), { cost: { kind: "fan-in", fanIn: 2 } });
    expect(r.cost).toBe(3);
    expect(r.exact).toBe(true);
  });

  it("too many inputs is a LimitError naming the limit", () => {
    // Shared contract lib/logic: MAX_INPUTS = 30.
    const spec: FunctionSpec = { inputs: Array.from({ length: 31 }, (_, i) => `i${i}`), outputs: [] };
    expect(() => minimize(spec)).toThrow(LimitError);
    try {
      minimize(spec);
    } catch (e) {
      expect((e as LimitError).limit).toBe("MAX_INPUTS");
    }
  });
});
