import { describe, expect, it } from "vitest";
import { cubeFromString, cubeToString, minterm, popcount, type Cube, type FunctionSpec } from "../../lib/logic";
import { LimitError, minimize } from "../../lib/minimize";
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

  it("BCD to excess-3 gives the published minimal forms, single literals taken as wires", async () => {
    // The code converter: outputs w x y z = the BCD digit a b c d plus 3, codes 10..15 unused (don't-care).
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
    // Source: M. M. Mano and M. D. Ciletti, "Digital Design", the code conversion example (BCD to excess-3),
    // from memory: w = A + BC + BD, x = B'C + B'D + BC'D', y = CD + C'D', z = D'.
    const published = [["1---", "-11-", "-1-1"], ["-01-", "-0-1", "-100"], ["--11", "--00"], ["---0"]];
    r.outputs.forEach((o, j) => expect(o.cubes.map((c) => cubeToString(c, 4)).sort()).toEqual(published[j]!.slice().sort()));
    // Seven products need a gate (a and d' are wires), with 17 literals among the distinct terms.
    expect(r.cost).toBe(7);
    // Reference: the arithmetic itself, evaluated by the test at every digit (not lib/verify).
    for (let v = 0; v <= 9; v++) {
      r.outputs.forEach((o, j) => {
        const got = o.cubes.some((c) => ((v ^ c.value) & c.mask) === 0);
        expect(got).toBe((((v + 3) >> (3 - j)) & 1) === 1);
      });
    }
    // Reference: every implicant enumerated by the test and an exact MILP (highs) with the same count
    // (products of two or more literals first, then literals): no shared cover does better.
    const ref = await milpMinimum(spec);
    const distinct = new Map<string, number>();
    for (const o of r.outputs) for (const c of o.cubes) distinct.set(`${c.value}/${c.mask}`, popcount(c.mask));
    const literals = [...distinct.values()].reduce((a, b) => a + b, 0);
    expect([r.cost, literals]).toEqual([ref.products, ref.literals]);
  });

  it("POS form of the Wikipedia example has the fewest sum terms and literals", async () => {
    // Source: Wikipedia, "Quine–McCluskey algorithm", worked example f = Σm(4,8,10,11,12,15) + d(9,14).
    const spec = spec1(4, [4, 8, 10, 11, 12, 15], [9, 14]);
    const r = minimize(spec, { form: "pos" });
    const o = r.outputs[0]!;
    expect(o.form).toBe("pos");
    expect(o.expression.startsWith("(")).toBe(true);
    expect(r.exact).toBe(true);
    // Reference: a minimum product of sums of f is a minimum sum of products of f' with every literal
    // inverted (De Morgan; common practice, no source); the minimum SOP of f' = Σm(0,1,2,3,5,6,7,13) + d(9,14)
    // by the test's own enumeration of implicants and an exact MILP (highs).
    const ref = await milpMinimum(spec1(4, [0, 1, 2, 3, 5, 6, 7, 13], [9, 14]));
    expect([o.products, o.literals]).toEqual([ref.products, ref.literals]);
    // Reference: the definition of a product of sums, evaluated by the test at every minterm: a sum term
    // (1 = plain literal, 0 = complemented) is 0 exactly on the points its literals all miss.
    for (let m = 0; m < 16; m++) {
      if ([9, 14].includes(m)) continue;
      const zero = o.cubes.some((c) => ((m ^ ~c.value) & c.mask) === 0);
      expect(!zero).toBe([4, 8, 10, 11, 12, 15].includes(m));
    }
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
    // The equation language's operators (lib/lang), no outside source: AND '*', OR '+', postfix ' for NOT
    // (the apostrophe for a complement is common textbook notation: common practice, no source).
    const r = minimize(spec1(2, [1], [], ["p", "q"]));
    expect(r.outputs[0]!.expression).toBe("p' * q");
  });

  it("the fan-in model prices splits of wide products", () => {
    // Common practice, no source: a 4-input AND from 2-input gates needs 3 gates; f = abcd alone costs 3.
    const r = minimize(spec1(4, [15]), { cost: { kind: "fan-in", fanIn: 2 } });
    expect(r.cost).toBe(3);
    expect(r.exact).toBe(true);
  });

  it("too many inputs is a LimitError saying so in plain words", () => {
    // Shared contract lib/logic: MAX_INPUTS = 30.
    const spec: FunctionSpec = { inputs: Array.from({ length: 31 }, (_, i) => `i${i}`), outputs: [] };
    let err: unknown = null;
    try {
      minimize(spec);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(LimitError);
    const e = err as LimitError;
    expect(e.limit).toBe("MAX_INPUTS");
    expect(e.what).toBe("limit of 30 inputs");
    expect(e.message).toContain("31 inputs");
    expect(e.message).toContain(e.hint);
    expect(e.message).not.toMatch(/MAX_INPUTS|timeLimitMs|budgetMs/);
  });

  it("the heuristic alone finishes an 18-input parity: every minterm its own prime, proven minimum", () => {
    // Common practice, no source: two ON points of a parity function are never one variable apart, so each
    // minterm is its own prime and the minimum sum of products is all 2^17 of them.
    const n = 18;
    const on: Cube[] = [];
    for (let m = 0; m < 2 ** n; m++) if (popcount(m) & 1) on.push(minterm(m, n));
    const spec: FunctionSpec = { inputs: Array.from({ length: n }, (_, i) => `x${i}`), outputs: [{ name: "p", on, dc: [] }] };
    const r = minimize(spec, { heuristic: true });
    expect(r.route).toBe("heuristic");
    expect(r.outputs[0]!.products).toBe(2 ** 17);
    expect(r.outputs[0]!.literals).toBe(18 * 2 ** 17);
    expect(r.lowerBound).toBe(2 ** 17);
    expect(r.exact).toBe(true);
    // Reference: the definition of parity, at a sample of points evaluated by the test.
    for (let m = 0; m < 2 ** n; m += 4099) {
      expect(r.outputs[0]!.cubes.some((c) => ((m ^ c.value) & c.mask) === 0)).toBe((popcount(m) & 1) === 1);
    }
  }, 120_000);

  it("above 20 inputs the heuristic's bound reads both corners of each ON cube", () => {
    // f = x20 · (x0' + x1' + … + x19') over 21 inputs, given as its 20 terms x_i'·x20. Their corners with the
    // free inputs at 0 are one point; with them at 1, twenty points, no two of which one product holds: the
    // smallest cube holding two of them holds the point with every input at 1, where f is 0. So no cover has
    // fewer than 20 products, and the 20 terms are one (the test's own argument, no source).
    const N = 21;
    const bit = (i: number) => 2 ** (N - 1 - i);
    const on: Cube[] = Array.from({ length: 20 }, (_, i) => ({ value: bit(20), mask: bit(20) + bit(i) }));
    const spec: FunctionSpec = { inputs: Array.from({ length: N }, (_, i) => `x${i}`), outputs: [{ name: "f", on, dc: [] }] };
    const r = minimize(spec, { heuristic: true });
    expect(r.route).toBe("heuristic");
    expect(r.lowerBound).toBe(20);
    expect(r.cost).toBe(20);
    // Reference: the definition of f, at the points with x20 = 1 and at most one other input at 0, evaluated by the test.
    const holds = (m: number) => r.outputs[0]!.cubes.some((c) => ((m ^ c.value) & c.mask) === 0);
    const all = 2 ** N - 1;
    expect(holds(all)).toBe(false);
    for (let i = 0; i < 20; i++) expect(holds(all - bit(i))).toBe(true);
    expect(holds(all - bit(20))).toBe(false);
  });

  it("a heuristic run out of time says which limit, and does not advise the heuristic", () => {
    const n = 18;
    const on: Cube[] = [];
    for (let m = 0; m < 2 ** n; m++) if (popcount(m) & 1) on.push(minterm(m, n));
    const spec: FunctionSpec = { inputs: Array.from({ length: n }, (_, i) => `x${i}`), outputs: [{ name: "p", on, dc: [] }] };
    let err: unknown = null;
    try {
      minimize(spec, { heuristic: true, timeLimitMs: 1 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(LimitError);
    const e = err as LimitError;
    expect(e.what).toBe("time limit of 1 ms");
    expect(e.message).toContain("time limit of 1 ms");
    expect(e.hint).not.toMatch(/heuristic/i);
    expect(e.message).not.toMatch(/timeLimitMs|budgetMs/);
  }, 120_000);
});
