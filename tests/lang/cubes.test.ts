// Cube-list algebra checked against brute-force membership computed here.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { absorb, cubesAnd, cubesNot, cubesOr, cubesXor, CubeLimitError, rangeToCubes, tableToCubes } from "../../lib/lang/cubes";
import type { Cube } from "../../lib/logic/index";

const member = (cs: Cube[], m: number) => cs.some((c) => ((m ^ c.value) & c.mask) === 0);
const set = (cs: Cube[], n: number) => Array.from({ length: 2 ** n }, (_, m) => member(cs, m));

const cubeArb = (n: number) =>
  fc.tuple(fc.nat(2 ** n - 1), fc.nat(2 ** n - 1)).map(([v, m]): Cube => ({ value: (v & m) >>> 0, mask: m >>> 0 }));
const listArb = (n: number) => fc.array(cubeArb(n), { maxLength: 7 });

describe("cube lists", () => {
  for (const n of [1, 3, 6]) {
    it(`NOT, AND, OR, XOR agree with brute force over ${n} inputs`, () => {
      fc.assert(
        fc.property(listArb(n), listArb(n), (a, b) => {
          const A = set(a, n);
          const B = set(b, n);
          expect(set(cubesNot(a, n), n)).toEqual(A.map((x) => !x));
          expect(set(cubesAnd(a, b), n)).toEqual(A.map((x, i) => x && B[i]!));
          expect(set(cubesOr(a, b), n)).toEqual(A.map((x, i) => x || B[i]!));
          expect(set(cubesXor(a, b, n), n)).toEqual(A.map((x, i) => x !== B[i]!));
          expect(set(absorb(a), n)).toEqual(A);
        }),
        { numRuns: 200 },
      );
    });
  }
  it("complements the empty list to the universe and the universe to nothing", () => {
    expect(cubesNot([], 4)).toEqual([{ value: 0, mask: 0 }]);
    expect(cubesNot([{ value: 0, mask: 0 }], 4)).toEqual([]);
  });
  it("keeps the complement of a 30-input product to 30 cubes (De Morgan, one cube per literal)", () => {
    const c: Cube = { value: 0x15555555, mask: 0x3fffffff };
    const comp = cubesNot([c], 30);
    expect(comp.length).toBe(30);
    expect(member(comp, c.value)).toBe(false);
    expect(member(comp, c.value ^ 1)).toBe(true);
  });
  it("reports a list that outgrows its limit", () => {
    // x1 x2 + x3 x4 + ... over 24 inputs: its complement has 2^12 products (from memory; each product picks one complemented literal per pair)
    const pairs: Cube[] = Array.from({ length: 12 }, (_, k) => {
      const bits = (3 << (2 * k)) >>> 0;
      return { value: bits, mask: bits };
    });
    expect(() => cubesNot(pairs, 24, 1000)).toThrow(CubeLimitError);
    expect(cubesNot(pairs, 24).length).toBe(4096);
  });
});

describe("minterm ranges", () => {
  it("cover exactly lo..hi", () => {
    fc.assert(
      fc.property(fc.nat(63), fc.nat(63), (x, y) => {
        const lo = Math.min(x, y);
        const hi = Math.max(x, y);
        const cs = rangeToCubes(lo, hi, 6);
        expect(set(cs, 6)).toEqual(Array.from({ length: 64 }, (_, m) => m >= lo && m <= hi));
      }),
    );
  });
  it("turn 0..2^k-1 into one cube", () => {
    expect(rangeToCubes(0, 255, 8)).toEqual([{ value: 0, mask: 0 }]);
  });
});

describe("truth table to cubes", () => {
  it("gives disjoint cubes with the same minterms, also over a subset of inputs", () => {
    fc.assert(
      fc.property(fc.array(fc.boolean(), { minLength: 64, maxLength: 64 }), (bits) => {
        // 6 local inputs mapped onto design inputs 1, 2, 4, 5, 6, 7 of 8
        const vars = [1, 2, 4, 5, 6, 7];
        const t = new Uint32Array(2);
        bits.forEach((b, m) => {
          if (b) t[m >>> 5]! |= 1 << (m & 31);
        });
        const cs = tableToCubes(t, vars, 8);
        for (let g = 0; g < 256; g++) {
          let local = 0;
          vars.forEach((v, j) => {
            if ((g >> (7 - v)) & 1) local |= 1 << (5 - j);
          });
          const hits = cs.filter((c) => ((g ^ c.value) & c.mask) === 0).length;
          expect(hits).toBe(bits[local] ? 1 : 0);
        }
      }),
      { numRuns: 100 },
    );
  });
});
