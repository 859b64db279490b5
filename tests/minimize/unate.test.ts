import { describe, expect, it } from "vitest";
import type { Cube } from "../../lib/logic";
import { OverBudget, WorkBudget, complement } from "../../lib/minimize/unate";
import { rng } from "./helpers";

// Reference: the definition of a cube (point m lies in c when ((m ^ value) & mask) === 0) and of the
// complement (every point lies in exactly one of F and its complement), checked by the test point by point.
const inside = (F: readonly Cube[], m: number) => F.some((c) => (((m ^ c.value) & c.mask) >>> 0) === 0);

describe("unate-recursive complement", () => {
  it("is exact with literals of the high variables (masks of 23 bits and more)", () => {
    // F = x25·x24' + x25·x0' + x25'·x24' + x25'·x0 over 26 variables (bit i = x_i): its complement is x24·x0 … with x25 either way,
    // that is the points where x24 = 1 and (x25 ? x0 = 1 : x0 = 0).
    const b = (i: number) => 2 ** i;
    const F: Cube[] = [
      { value: b(25), mask: b(25) + b(24) },
      { value: b(25), mask: b(25) + b(0) },
      { value: 0, mask: b(25) + b(24) },
      { value: b(0), mask: b(25) + b(0) },
    ];
    const space = 2 ** 26 - 1;
    const G = complement(F, space);
    // Every combination of the three variables involved, the other 23 at random.
    const r = rng(26);
    for (let k = 0; k < 8; k++) {
      for (let t = 0; t < 50; t++) {
        let m = Math.floor(r() * 2 ** 26);
        m = (m & ~(b(25) + b(24) + b(0))) + ((k & 4 ? b(25) : 0) + (k & 2 ? b(24) : 0) + (k & 1 ? b(0) : 0));
        expect(inside(F, m) !== inside(G, m)).toBe(true);
      }
    }
  });

  it("is exact on random covers over 24 to 30 variables", () => {
    const r = rng(2430);
    for (let s = 0; s < 30; s++) {
      const n = 24 + (s % 7);
      const space = 2 ** n - 1;
      // Cubes on a few high and low variables, so that the recursion splits on wide masks.
      const vars = [0, 1, 2, n - 1, n - 2, n - 3, n - 4];
      const F: Cube[] = Array.from({ length: 2 + (s % 5) }, () => {
        let mask = 0;
        let value = 0;
        for (const v of vars) {
          if (r() < 0.45) {
            mask += 2 ** v;
            if (r() < 0.5) value += 2 ** v;
          }
        }
        return { value, mask };
      });
      const G = complement(F, space);
      for (let t = 0; t < 400; t++) {
        const m = Math.floor(r() * 2 ** n);
        expect(inside(F, m) !== inside(G, m)).toBe(true);
      }
    }
  });

  it("with a work budget, gives the same complement or stops with OverBudget", () => {
    // x0·x1' + x1·x2' + … + x23·x0' over 24 variables: its complement is the two points 0…0 and 1…1
    // (common practice, no source: a point outside every term has no input at 1 next to one at 0 around the ring).
    const n = 24;
    const ring: Cube[] = Array.from({ length: n }, (_, i) => ({ value: 2 ** i, mask: 2 ** i + 2 ** ((i + 1) % n) }));
    const space = 2 ** n - 1;
    const G = complement(ring, space, new WorkBudget(1e9));
    expect(G.map((c) => [c.value, c.mask]).sort((a, b) => a[0]! - b[0]!)).toEqual([[0, space], [space, space]]);
    expect(() => complement(ring, space, new WorkBudget(1000))).toThrow(OverBudget);
  });
});
