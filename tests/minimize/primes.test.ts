import { describe, expect, it } from "vitest";
import { cubeToString, fullMask, minterm, type FunctionSpec } from "../../lib/logic";
import { minimize } from "../../lib/minimize";
import { denseTaggedPrimes, taggedPrimes } from "../../lib/minimize/primes";
import { primesOfCover } from "../../lib/minimize/unate";
import { bruteImplicants, isPrimeFor, randomSpec } from "./helpers";

describe("recursive prime generation", () => {
  for (const seed of [71, 72, 73, 74]) {
    it(`equals brute-force primes on 6 inputs (seed ${seed})`, () => {
      const spec = randomSpec(6, 1, seed, 0.5, 0.15);
      const care = spec.outputs[0]!.on.concat(spec.outputs[0]!.dc);
      const got = primesOfCover(care, fullMask(6)).map((c) => cubeToString(c, 6)).sort();
      // Reference: the test's own enumeration of all 3^6 cubes, keeping the primes.
      const want = bruteImplicants(spec)
        .map((p) => p.cube)
        .filter((c) => isPrimeFor(spec, 0, c))
        .map((c) => cubeToString(c, 6))
        .sort();
      expect(got).toEqual(want);
    });
  }

  it("a 14-line priority encoder's q3 and valid (too many implicants for the tables) are solved exactly", () => {
    // Hand computation: valid = OR of the 14 lines needs 14 products (the 14 one-hot points are pairwise
    // independent) and q3 = l13 + ... + l8 reuses six of them, so the design needs exactly 14 products
    // of one literal each.
    const n = 14;
    const on: number[][] = [[], []];
    for (let m = 1; m < 2 ** n; m++) {
      const top = 31 - Math.clz32(m);
      if ((top >> 3) & 1) on[0]!.push(m);
      on[1]!.push(m);
    }
    const spec: FunctionSpec = {
      inputs: Array.from({ length: n }, (_, i) => `l${n - 1 - i}`),
      outputs: ["q3", "valid"].map((name, j) => ({ name, on: on[j]!.map((m) => minterm(m, n)), dc: [] })),
    };
    const r = minimize(spec);
    expect(r.exact).toBe(true);
    expect(r.cost).toBe(14);
    expect(r.outputs[1]!.products).toBe(14);
    expect(r.outputs[1]!.literals).toBe(14);
    expect(r.outputs[0]!.expression).toBe("l13 + l12 + l11 + l10 + l9 + l8");
    expect(r.shared).toBe(6);
  });
});

describe("dense multi-output prime table", () => {
  for (const [n, k, seed] of [
    [5, 3, 81],
    [6, 2, 82],
    [6, 3, 83],
    [7, 1, 84],
  ] as const) {
    it(`equals brute-force multi-output primes on ${n} inputs, ${k} outputs (seed ${seed})`, () => {
      const spec = randomSpec(n, k, seed, 0.45, 0.15);
      const imps = bruteImplicants(spec);
      const tagOfCube = new Map(imps.map((p) => [`${p.cube.value}/${p.cube.mask}`, p.tag]));
      // Reference: the test's own enumeration; a multi-output prime is an implicant no one-literal
      // expansion keeps with its whole tag (it is then prime for the product of its tag's outputs).
      const want = imps
        .filter((p) => {
          for (let b = 0; b < n; b++) {
            if (!(p.cube.mask & (1 << b))) continue;
            const up = tagOfCube.get(`${p.cube.value & ~(1 << b)}/${p.cube.mask & ~(1 << b)}`) ?? 0;
            if ((up & p.tag) === p.tag) return false;
          }
          return true;
        })
        .map((p) => `${cubeToString(p.cube, n)}:${p.tag}`)
        .sort();
      const tagOfMinterm = (m: number) => tagOfCube.get(`${m}/${fullMask(n)}`) ?? 0;
      const limits = { maxPrimes: Infinity, maxImplicants: Infinity, deadline: Infinity };
      const dense = denseTaggedPrimes(n, Uint32Array.from({ length: 2 ** n }, (_, m) => tagOfMinterm(m)), limits).map((p) => `${cubeToString(p, n)}:${p.tag}`).sort();
      expect(dense).toEqual(want);
      const minterms = Array.from({ length: 2 ** n }, (_, m) => m);
      const tables = taggedPrimes(n, minterms, tagOfMinterm, limits).map((p) => `${cubeToString(p, n)}:${p.tag}`).sort();
      expect(tables).toEqual(want);
    });
  }
});

describe("functions without adjacent care points", () => {
  for (const n of [6, 9]) {
    it(`odd parity of ${n} inputs needs all 2^(n-1) minterms as products`, () => {
      // From memory: no two odd-parity points are one variable apart, so every ON minterm is its own
      // prime and essential; the minimum is 2^(n-1) products of n literals. Checked here by brute force too.
      const on: number[] = [];
      for (let m = 0; m < 2 ** n; m++) {
        let p = 0;
        for (let x = m; x; x &= x - 1) p ^= 1;
        if (p) on.push(m);
      }
      const spec: FunctionSpec = {
        inputs: Array.from({ length: n }, (_, i) => `x${i}`),
        outputs: [{ name: "p", on: on.map((m) => minterm(m, n)), dc: [] }],
      };
      const brute = bruteImplicants(spec).filter((p) => isPrimeFor(spec, 0, p.cube));
      expect(brute.length).toBe(2 ** (n - 1));
      const r = minimize(spec);
      expect(r.exact).toBe(true);
      expect(r.primes).toBe(2 ** (n - 1));
      expect([r.outputs[0]!.products, r.outputs[0]!.literals]).toEqual([2 ** (n - 1), n * 2 ** (n - 1)]);
    });
  }
});
