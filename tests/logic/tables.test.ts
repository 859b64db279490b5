import { describe, expect, it } from "vitest";
import { fullMask, tableFromCubes, type Cube } from "../../lib/logic";
import { coverTable } from "../../lib/verify";
import { rng } from "../minimize/helpers";

// Reference: the definition of a cube (lib/logic): minterm m lies in cube c when
// ((m ^ value) & mask) === 0; the table holds bit m at word m >>> 5, bit m & 31.
function naive(cubes: Cube[], n: number): Uint32Array {
  const t = new Uint32Array(Math.max(1, 2 ** n / 32));
  for (let m = 0; m < 2 ** n; m++) {
    if (cubes.some((c) => ((m ^ c.value) & c.mask) === 0)) t[m >>> 5]! |= 1 << (m & 31);
  }
  return t;
}

function randomCubes(n: number, count: number, seed: number, stray = false): Cube[] {
  const r = rng(seed);
  const full = fullMask(n);
  return Array.from({ length: count }, () => {
    // Masks of every density, minterms and the constant 1 included.
    const density = r();
    let mask = 0;
    for (let i = 0; i < n; i++) if (r() < density) mask |= 1 << i;
    mask &= full;
    // With `stray`, the value also keeps bits outside the mask, which the definition ignores.
    return { value: Math.floor(r() * 2 ** n) & (stray ? full : mask), mask };
  });
}

describe("truth tables of cube lists", () => {
  for (const n of [0, 1, 2, 3, 4, 5, 6, 7, 9, 12]) {
    it(`tableFromCubes and verify's coverTable match the definition over ${n} inputs`, () => {
      for (let s = 0; s < 20; s++) {
        const cubes = randomCubes(n, 1 + (s % 7), 1000 * n + s);
        const ref = naive(cubes, n);
        expect(tableFromCubes(cubes, n)).toEqual(ref);
        expect(coverTable(cubes, n)).toEqual(ref);
        const loose = randomCubes(n, 1 + (s % 7), 7000 * n + s, true);
        const looseRef = naive(loose, n);
        expect(tableFromCubes(loose, n)).toEqual(looseRef);
        expect(coverTable(loose, n)).toEqual(looseRef);
      }
    });
  }
});
