// Elaboration beyond truth-table size, limits, and never lines; expected values
// from brute force in this file or worked by hand as noted.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSource } from "../../lib/lang/index";
import type { Cube } from "../../lib/logic/index";

const member = (cs: Cube[], m: number) => cs.some((c) => ((m ^ c.value) & c.mask) === 0);
const bit = (m: number, i: number, n: number) => ((m >>> (n - 1 - i)) & 1) === 1;

describe("wide designs", () => {
  const n = 24;
  const names = Array.from({ length: n }, (_, i) => `x${i}`);
  // f: parity-free mix over all 24 inputs; g: only 3 inputs (elaborated as a table over those 3)
  const src = [
    `inputs ${names.join(", ")}`,
    "outputs f, g, h",
    "let lhs = x0 * x1' + x2 * x3 * x4 + x5 ^ x6",
    "f = lhs * (x7 + x8 + x9 + x10) + x11 * x12 * x13 * x14 * x15 * x16 * x17 * x18 * x19 * x20 * x21 * x22 * x23'",
    "g = x3 ^ x17 ^ x23",
    "h = (x0 + x1 + x2 + x3 + x4 + x5 + x6 + x7 + x8 + x9 + x10 + x11 + x12 + x13 + x14 + x15 + x16 + x17 + x18 + x19 + x20 + x21 + x22 + x23)'",
    "never x0 * x1 * x2 * x3",
  ].join("\n");
  const f = (m: number) => {
    const x = (i: number) => bit(m, i, n);
    const lhs = (x(0) && !x(1)) || (x(2) && x(3) && x(4)) || x(5) !== x(6);
    let tail = !x(23);
    for (let i = 11; i <= 22; i++) tail &&= x(i);
    return (lhs && (x(7) || x(8) || x(9) || x(10))) || tail;
  };
  const never = (m: number) => bit(m, 0, n) && bit(m, 1, n) && bit(m, 2, n) && bit(m, 3, n);
  const result = compileSource(src);
  it("compiles without diagnostics", () => {
    expect(result.diagnostics).toEqual([]);
  });
  it("matches brute force at random minterms, impossible ones as don't-cares", () => {
    const spec = result.spec!;
    const [F, G, H] = spec.outputs;
    fc.assert(
      fc.property(fc.nat(2 ** n - 1), (m) => {
        const nv = never(m);
        expect(member(F!.on, m)).toBe(!nv && f(m));
        expect(member(F!.dc, m)).toBe(nv);
        const g = bit(m, 3, n) !== bit(m, 17, n) !== bit(m, 23, n);
        expect(member(G!.on, m)).toBe(!nv && g);
        expect(member(H!.on, m)).toBe(m === 0);
      }),
      { numRuns: 3000 },
    );
    expect(member(H!.on, 0)).toBe(true);
  });
});

describe("limits", () => {
  it("names maxStatements", () => {
    const src = "inputs a\noutputs f\nf = a\n" + "// x\nlet t = a\n".repeat(2000);
    const r = compileSource(src);
    expect(r.spec).toBeNull();
    expect(r.ast).toBeNull();
    expect(r.diagnostics.map((d) => d.message).join()).toMatch(/limit is 2000 \(maxStatements\)/);
  });
  it("names maxSourceLength", () => {
    const r = compileSource("inputs a\noutputs f\nf = a\n", { maxSourceLength: 10 });
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0]!.message).toMatch(/limit is 10 \(maxSourceLength\)/);
    // offset 10 is line 2, column 2 of "inputs a\noutputs f" (counted by hand)
    expect(r.diagnostics[0]).toMatchObject({ line: 2, column: 2 });
  });
  it("names maxInputsPerOutput", () => {
    const r = compileSource("inputs a, b, c, d\noutputs f, g\nf = a * b * c * d\ng = a\n", { maxInputsPerOutput: 3 });
    expect(r.spec).toBeNull();
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0]).toMatchObject({ line: 3, column: 1, severity: "error" });
    expect(r.diagnostics[0]!.message).toMatch(/depends on 4 inputs; the limit is 3 inputs per output \(maxInputsPerOutput\)/);
  });
  it("names maxCubes when a wide function grows too large", () => {
    // (x0 + x1)(x2 + x3)...(x22 + x23) multiplies out to 2^12 products (from memory)
    const names = Array.from({ length: 24 }, (_, i) => `x${i}`);
    const prod = Array.from({ length: 12 }, (_, k) => `(x${2 * k} + x${2 * k + 1})`).join(" * ");
    const src = `inputs ${names.join(", ")}\noutputs f\nf = ${prod}\n`;
    const r = compileSource(src, { maxCubes: 500 });
    expect(r.spec).toBeNull();
    expect(r.diagnostics[0]!.message).toMatch(/more than 500 product terms.*\(maxCubes\)/);
    expect(compileSource(src).spec!.outputs[0]!.on.length).toBe(4096);
  });
});

describe("deep sources", () => {
  it("work out a chain of 1990 intermediates without exhausting the stack", () => {
    // t_k = t_(k-1) ^ a, starting from t0 = a: t_k is a when k is even, 0 when odd (by hand)
    let src = "inputs a, b\noutputs f\nlet t0 = a\n";
    for (let k = 1; k < 1990; k++) src += `let t${k} = t${k - 1} ^ a\n`;
    src += "f = t1989 + b\n";
    const r = compileSource(src);
    expect(r.diagnostics).toEqual([]);
    const f = r.spec!.outputs[0]!;
    // t1989 is 0 (odd), so f = b: minterms 1 and 3 over (a, b)
    expect([0, 1, 2, 3].map((m) => member(f.on, m))).toEqual([false, true, false, true]);
  });
  it("names maxNesting for parentheses and for runs of NOT", () => {
    const deep = "inputs a\noutputs f\nf = " + "(".repeat(65) + "a" + ")".repeat(65) + "\n";
    const r = compileSource(deep);
    expect(r.diagnostics).toHaveLength(1);
    // the 65th '(' is column 4 + 65 = 69 on line 3 (counted by hand)
    expect(r.diagnostics[0]).toMatchObject({ line: 3, column: 69, endColumn: 70 });
    expect(r.diagnostics[0]!.message).toMatch(/\(maxNesting\)/);
    const nots = compileSource("inputs a\noutputs f\nf = a" + "'".repeat(200) + "\n");
    expect(nots.diagnostics[0]!.message).toMatch(/NOT signs in a row.*\(maxNesting\)/);
    // 64 levels are fine (the limit itself)
    const ok = compileSource("inputs a\noutputs f\nf = " + "(".repeat(64) + "a" + ")".repeat(64) + "\n");
    expect(ok.diagnostics).toEqual([]);
  });
});

describe("never lines", () => {
  it("remove impossible minterms from every ON-set and add them to every DC-set", () => {
    // by hand: a + b is on at 1, 2, 3; never a * b takes 3 out; g = on(3) keeps nothing on
    const r = compileSource("inputs a, b\noutputs f, g\nf = a + b\ng = on(3)\nnever a * b\n");
    const [f, g] = r.spec!.outputs;
    expect([0, 1, 2, 3].map((m) => member(f!.on, m))).toEqual([false, true, true, false]);
    expect([0, 1, 2, 3].map((m) => member(g!.on, m))).toEqual([false, false, false, false]);
    expect([0, 1, 2, 3].map((m) => member(g!.dc, m))).toEqual([false, false, false, true]);
  });
  it("apply to outputs that do not read the never line's inputs", () => {
    const r = compileSource("inputs a, b, c\noutputs f\nf = c\nnever a * b\n");
    expect(r.diagnostics).toEqual([]);
    const f = r.spec!.outputs[0]!;
    // by hand: c is on at 1, 3, 5, 7; a * b is 6, 7
    expect([...Array(8).keys()].filter((m) => member(f.on, m))).toEqual([1, 3, 5]);
    expect([...Array(8).keys()].filter((m) => member(f.dc, m))).toEqual([6, 7]);
  });
});
