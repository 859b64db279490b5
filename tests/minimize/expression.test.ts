import { describe, expect, it } from "vitest";
import { formatCover } from "../../lib/minimize";
import { rng } from "./helpers";

// Reference: the test's own plain formatting of the language's term syntax (common practice, no source):
// literals in declared order, ' for a complement, " * " inside SOP terms, " + " inside POS sums.
function naive(cubes: { value: number; mask: number }[], inputs: string[], form: "sop" | "pos"): string {
  const n = inputs.length;
  if (cubes.length === 0) return form === "sop" ? "0" : "1";
  if (cubes.some((c) => c.mask === 0)) return form === "sop" ? "1" : "0";
  const term = (c: { value: number; mask: number }) =>
    inputs
      .map((x, i) => {
        const bit = 1 << (n - 1 - i);
        return c.mask & bit ? (c.value & bit ? x : `${x}'`) : null;
      })
      .filter((s) => s !== null)
      .join(form === "sop" ? " * " : " + ");
  return form === "sop" ? cubes.map(term).join(" + ") : cubes.map((c) => `(${term(c)})`).join(" * ");
}

describe("expression text", () => {
  for (const n of [1, 3, 4, 5, 9, 13, 20]) {
    it(`matches plain formatting on random covers over ${n} inputs`, () => {
      const r = rng(500 + n);
      const inputs = Array.from({ length: n }, (_, i) => (i % 3 === 0 ? `paddle_${i}` : i % 3 === 1 ? `lvl${i}` : `schütz${i}`));
      const full = 2 ** n - 1;
      const cubes = Array.from({ length: 40 }, () => {
        const mask = (Math.floor(r() * (full + 1)) | (1 << Math.floor(r() * n))) & full;
        return { value: Math.floor(r() * (full + 1)) & mask, mask };
      });
      for (const form of ["sop", "pos"] as const) expect(formatCover(cubes, inputs, form)).toBe(naive(cubes, inputs, form));
    });
  }
  // Covers of 8192 terms and more are written as bytes, in groups of 8 inputs.
  for (const n of [2, 7, 16, 21, 30]) {
    it(`matches plain formatting on a cover of 9000 terms over ${n} inputs`, () => {
      const r = rng(900 + n);
      const inputs = Array.from({ length: n }, (_, i) => (i % 2 === 0 ? `q${i}` : `ŝig_${i}`));
      const full = 2 ** n - 1;
      const cubes = Array.from({ length: 9000 }, () => {
        const mask = (Math.floor(r() * (full + 1)) | (1 << Math.floor(r() * n))) & full;
        return { value: Math.floor(r() * (full + 1)) & mask, mask };
      });
      for (const form of ["sop", "pos"] as const) expect(formatCover(cubes, inputs, form)).toBe(naive(cubes, inputs, form));
    });
  }
});
