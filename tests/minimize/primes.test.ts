import { describe, expect, it } from "vitest";
import { cubeToString, fullMask, minterm, popcount, tableFromCubes, type Cube, type FunctionSpec } from "../../lib/logic";
import { coveringProblem, minimize } from "../../lib/minimize";
import { coverTaggedPrimes, denseTaggedPrimes, taggedPrimes, type TaggedPrime } from "../../lib/minimize/primes";
import { primesOfCover } from "../../lib/minimize/unate";
import { bruteImplicants, isPrimeFor, randomSpec, rng } from "./helpers";

/**
 * Reference: the test's own enumeration of all 3^n cubes (bruteImplicants); a multi-output prime is an
 * implicant no one-literal expansion keeps with its whole tag (it is then prime for the product of its
 * tag's outputs). Returns "cube:tag" strings, sorted.
 */
function bruteTaggedPrimes(spec: FunctionSpec): string[] {
  const n = spec.inputs.length;
  const imps = bruteImplicants(spec);
  const tagOfCube = new Map(imps.map((p) => [`${p.cube.value}/${p.cube.mask}`, p.tag]));
  return imps
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
}

/** A specification whose outputs' ON sets are the given tables (no DC). */
function specOfTables(care: Uint32Array[], n: number): FunctionSpec {
  return {
    inputs: Array.from({ length: n }, (_, i) => `x${i}`),
    outputs: care.map((t, j) => ({
      name: `f${j}`,
      on: Array.from({ length: 2 ** n }, (_, m) => m)
        .filter((m) => (t[m >>> 5]! >>> (m & 31)) & 1)
        .map((m) => minterm(m, n)),
      dc: [],
    })),
  };
}

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
    // Hand computation: valid = OR of the 14 lines needs 14 terms (the 14 one-hot points are pairwise
    // independent), each of one literal, and q3 = l13 + ... + l8 reuses six of them: 14 terms, all wires,
    // so no product needs a gate.
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
    expect(r.cost).toBe(0);
    expect(r.outputs[1]!.products).toBe(14);
    expect(r.outputs[1]!.literals).toBe(14);
    expect(r.outputs[0]!.expression).toBe("l13 + l12 + l11 + l10 + l9 + l8");
    expect(r.shared).toBe(6);
  });
});

describe("dense multi-output prime table", () => {
  // Both of its ways: a scan of the whole table above 55 % of the minterms in some care set, a worklist of
  // the implicants at or below (the last cases, and random ones of one output at 40 % ON and 10 % DC).
  for (const [n, k, seed, pOn, pDc] of [
    [5, 3, 81, 0.45, 0.15],
    [6, 2, 82, 0.45, 0.15],
    [6, 3, 83, 0.45, 0.15],
    [7, 1, 84, 0.45, 0.15],
    [7, 1, 85, 0.3, 0.1],
    [8, 1, 86, 0.4, 0.1],
    [6, 2, 87, 0.2, 0.1],
    [8, 3, 88, 0.15, 0.05],
  ] as const) {
    it(`equals brute-force multi-output primes on ${n} inputs, ${k} outputs, ${pOn * 100} % ON (seed ${seed}), in ternary order`, () => {
      const spec = randomSpec(n, k, seed, pOn, pDc);
      // Reference: the test's own enumeration (bruteTaggedPrimes).
      const want = bruteTaggedPrimes(spec);
      const tagOfCube = new Map(bruteImplicants(spec).map((p) => [`${p.cube.value}/${p.cube.mask}`, p.tag]));
      const tagOfMinterm = (m: number) => tagOfCube.get(`${m}/${fullMask(n)}`) ?? 0;
      const limits = { maxPrimes: Infinity, maxImplicants: Infinity, deadline: Infinity };
      const got = denseTaggedPrimes(n, Uint32Array.from({ length: 2 ** n }, (_, m) => tagOfMinterm(m)), limits);
      const dense = got.map((p) => `${cubeToString(p, n)}:${p.tag}`).sort();
      expect(dense).toEqual(want);
      // Ternary order (digit i: 0 or 1 the literal's value, 2 absent), which the cover search's tie-breaks depend on.
      const ternary = got.map((p) => {
        let t = 0;
        for (let i = n - 1; i >= 0; i--) t = 3 * t + (((p.mask >>> i) & 1) === 0 ? 2 : (p.value >>> i) & 1);
        return t;
      });
      for (let i = 1; i < ternary.length; i++) expect(ternary[i]!).toBeGreaterThan(ternary[i - 1]!);
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

/**
 * ON ∪ DC of each output as a few random cubes of 1 .. 4 literals, so the cubes are large; the last
 * output is sometimes the union of the others (nested outputs, like a "valid" flag), and an output is
 * sometimes a copy of the first (identical outputs).
 */
function largeCubeCovers(n: number, k: number, seed: number): Cube[][] {
  const r = rng(seed);
  const cube = (): Cube => {
    let mask = 0;
    const lits = Math.min(n, 1 + Math.floor(r() * 4));
    while (popcount(mask) < lits) mask |= 1 << Math.floor(r() * n);
    return { value: Math.floor(r() * 2 ** n) & mask, mask };
  };
  const covers: Cube[][] = [];
  for (let j = 0; j < k; j++) {
    const shape = r();
    if (j === k - 1 && j > 0 && shape < 0.3) covers.push(covers.flat());
    else if (j > 0 && shape > 0.85) covers.push(covers[0]!.slice());
    else covers.push(Array.from({ length: 1 + Math.floor(r() * 6) }, cube));
  }
  return covers;
}

const largeCubeTables = (n: number, k: number, seed: number) => largeCubeCovers(n, k, seed).map((cv) => tableFromCubes(cv, n));

describe("multi-output primes from cube covers", () => {
  const key = (p: TaggedPrime, n: number) => `${cubeToString(p, n)}:${p.tag}`;
  const limits = { maxPrimes: Infinity, maxImplicants: Infinity, deadline: Infinity };
  const mintermTags = (care: Uint32Array[], n: number) =>
    Uint32Array.from({ length: 2 ** n }, (_, m) => care.reduce((t, c, j) => t | (((c[m >>> 5]! >>> (m & 31)) & 1) << j), 0));

  for (let seed = 1; seed <= 80; seed++) {
    const n = seed <= 20 ? 1 + (seed % 5) : 6 + (seed % 6);
    const k = 1 + (seed % 5);
    it(`equal brute-force multi-output primes, in the dense table's order (${n} inputs, ${k} outputs, seed ${seed})`, () => {
      const care = largeCubeTables(n, k, 1000 + seed);
      const tags = mintermTags(care, n);
      const got = coverTaggedPrimes(n, care, limits).map((p) => key(p, n));
      // Reference up to 8 inputs: the test's own enumeration of every cube (above, 3^n is too slow for a unit test).
      if (n <= 8) expect(got.slice().sort()).toEqual(bruteTaggedPrimes(specOfTables(care, n)));
      // Consistency with the other two routes (each checked against brute force in this file): the same set,
      // and the dense table's (ternary) order, which the cover search's tie-breaks depend on.
      const dense = denseTaggedPrimes(n, tags, limits).map((p) => key(p, n));
      expect(got).toEqual(dense);
      const minterms = Array.from({ length: 2 ** n }, (_, m) => m);
      const tables = taggedPrimes(n, minterms, (m) => tags[m]!, limits).map((p) => key(p, n));
      expect(got.slice().sort()).toEqual(tables.sort());
    });
  }

  for (const seed of [1, 2, 3, 4]) {
    it(`give coveringProblem the dense table's primes on 12 inputs, 4 outputs, ON and DC (seed ${seed})`, () => {
      // minimize() and coveringProblem() pick the cube route for such functions by its cost; the result must not change.
      const n = 12;
      const on = largeCubeCovers(n, 4, 3000 + seed);
      const dc = largeCubeCovers(n, 4, 4000 + seed).map((cv) => cv.slice(0, 1));
      const spec: FunctionSpec = {
        inputs: Array.from({ length: n }, (_, i) => `x${i}`),
        outputs: on.map((cv, j) => ({ name: `f${j}`, on: cv, dc: dc[j]! })),
      };
      const care = on.map((cv, j) => tableFromCubes(cv.concat(dc[j]!), n));
      const dense = denseTaggedPrimes(n, mintermTags(care, n), limits).map((p) => key(p, n));
      expect(coveringProblem(spec).primes.map((p) => key(p, n))).toEqual(dense);
    });
  }

  for (const seed of [7, 8, 9]) {
    it(`equal brute-force multi-output primes on 6 inputs, 3 outputs (seed ${seed})`, () => {
      const n = 6;
      const care = largeCubeTables(n, 3, 2000 + seed);
      // Reference: the test's own enumeration of all 3^6 cubes (bruteTaggedPrimes).
      const want = bruteTaggedPrimes(specOfTables(care, n));
      expect(coverTaggedPrimes(n, care, limits).map((p) => key(p, n)).sort()).toEqual(want);
    });
  }
});
