// Property tests (fast-check). The truth tables here come from a tiny
// evaluator written in this file, independent of the language module.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSource, formatSource, parseSource } from "../../lib/lang/index";
import type { Cube } from "../../lib/logic/index";

type Tree =
  | { k: "var"; i: number }
  | { k: "const"; v: 0 | 1 }
  | { k: "not"; a: Tree }
  | { k: "and" | "or" | "xor"; a: Tree; b: Tree };

const NAMES = ["a", "b", "c", "d", "e"];

function evalTree(t: Tree, env: boolean[]): boolean {
  switch (t.k) {
    case "var":
      return env[t.i]!;
    case "const":
      return t.v === 1;
    case "not":
      return !evalTree(t.a, env);
    case "and":
      return evalTree(t.a, env) && evalTree(t.b, env);
    case "or":
      return evalTree(t.a, env) || evalTree(t.b, env);
    case "xor":
      return evalTree(t.a, env) !== evalTree(t.b, env);
  }
}

/** Minterm m over n inputs, first input = most significant bit (lib/logic's bit order, as truth tables are usually written: common practice, no source). */
function envOf(m: number, n: number): boolean[] {
  return Array.from({ length: n }, (_, i) => ((m >> (n - 1 - i)) & 1) === 1);
}

function tableOfTree(t: Tree, n: number): boolean[] {
  return Array.from({ length: 2 ** n }, (_, m) => evalTree(t, envOf(m, n)));
}

function inCubes(cubes: Cube[], m: number): boolean {
  return cubes.some((c) => ((m ^ c.value) & c.mask) === 0);
}

/** Fully parenthesised text with a chosen spelling for each operator. */
function printTree(t: Tree, spell: number[]): string {
  const pick = <T,>(xs: T[], salt: number) => xs[(spell[salt % spell.length]! + salt) % xs.length]!;
  let salt = 0;
  const go = (u: Tree): string => {
    salt++;
    switch (u.k) {
      case "var":
        return NAMES[u.i]!;
      case "const":
        return String(u.v);
      case "not": {
        const form = pick([0, 1, 2], salt);
        const inner = go(u.a);
        return form === 0 ? `(${inner})'` : form === 1 ? `!(${inner})` : `~(${inner})`;
      }
      case "and":
        return `(${go(u.a)} ${pick(["*", "&", "\u00b7"], salt)} ${go(u.b)})`;
      case "or":
        return `(${go(u.a)} ${pick(["+", "|"], salt)} ${go(u.b)})`;
      case "xor":
        return `(${go(u.a)} ^ ${go(u.b)})`;
    }
  };
  return go(t);
}

const treeArb = (n: number) =>
  fc.letrec<{ tree: Tree }>((tie) => ({
    tree: fc.oneof(
      { depthSize: "small", withCrossShrink: true },
      fc.integer({ min: 0, max: n - 1 }).map((i): Tree => ({ k: "var", i })),
      fc.constantFrom<0 | 1>(0, 1).map((v): Tree => ({ k: "const", v })),
      tie("tree").map((a): Tree => ({ k: "not", a })),
      fc.record({ k: fc.constantFrom<"and" | "or" | "xor">("and", "or", "xor"), a: tie("tree"), b: tie("tree") }) as fc.Arbitrary<Tree>,
    ),
  })).tree;

function designOf(body: string, n: number): string {
  // the dc-free output plus a second output that reads every input keeps "unused input" warnings away
  return `inputs ${NAMES.slice(0, n).join(", ")}\noutputs f, all_\nf = ${body}\nall_ = ${NAMES.slice(0, n).join(" * ")}\n`;
}

function tableOfSource(src: string, n: number): boolean[] {
  const r = compileSource(src);
  expect(r.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  const f = r.spec!.outputs.find((o) => o.name === "f")!;
  expect(f.dc).toEqual([]);
  return Array.from({ length: 2 ** n }, (_, m) => inCubes(f.on, m));
}

describe("random expressions", () => {
  it("elaborate to the truth table this test computes, and keep it through formatting", () => {
    fc.assert(
      fc.property(treeArb(4), fc.array(fc.nat(5), { minLength: 1, maxLength: 6 }), (tree, spell) => {
        const n = 4;
        const src = designOf(printTree(tree, spell), n);
        const want = tableOfTree(tree, n);
        expect(tableOfSource(src, n)).toEqual(want);
        const once = formatSource(src);
        expect("text" in once).toBe(true);
        const text = (once as { text: string }).text;
        expect(tableOfSource(text, n)).toEqual(want);
        expect(formatSource(text)).toEqual({ text });
      }),
      { numRuns: 300 },
    );
  });
});

// Flat expressions without parentheses: the expected value comes from a
// precedence-climbing evaluator here, with NOT > AND > XOR > OR. NOT above AND
// above OR is common practice, no source; XOR between AND and OR is the
// equation language's own choice (the grammar in lib/lang), no outside source.
describe("precedence", () => {
  type Flat = { operands: { i: number; pre: number; post: number }[]; ops: ("+" | "*" | "^")[] };
  const flatArb = fc.integer({ min: 1, max: 6 }).chain((len) =>
    fc.record({
      operands: fc.array(fc.record({ i: fc.nat(3), pre: fc.nat(2), post: fc.nat(2) }), { minLength: len, maxLength: len }),
      ops: fc.array(fc.constantFrom<"+" | "*" | "^">("+", "*", "^"), { minLength: len - 1, maxLength: len - 1 }),
    }),
  );
  const text = (f: Flat) =>
    f.operands
      .map((o, k) => (k > 0 ? ` ${f.ops[k - 1]} ` : "") + "!".repeat(o.pre) + NAMES[o.i] + "'".repeat(o.post))
      .join("");
  const value = (f: Flat, env: boolean[]): boolean => {
    const vals = f.operands.map((o) => ((o.pre + o.post) % 2 === 1 ? !env[o.i] : env[o.i]!));
    // split on OR, then XOR, then AND: the loosest operator is split first
    const groupsOr: boolean[][][] = [[[vals[0]!]]];
    f.ops.forEach((op, k) => {
      const v = vals[k + 1]!;
      const lastOr = groupsOr[groupsOr.length - 1]!;
      if (op === "+") groupsOr.push([[v]]);
      else if (op === "^") lastOr.push([v]);
      else lastOr[lastOr.length - 1]!.push(v);
    });
    return groupsOr.some((xorGroup) => xorGroup.map((andGroup) => andGroup.every(Boolean)).reduce((x, y) => x !== y, false));
  };
  it("NOT binds tighter than AND, AND than XOR, XOR than OR", () => {
    fc.assert(
      fc.property(flatArb, (f) => {
        const n = 4;
        const src = designOf(text(f), n);
        const want = Array.from({ length: 16 }, (_, m) => value(f, envOf(m, n)));
        expect(tableOfSource(src, n)).toEqual(want);
      }),
      { numRuns: 300 },
    );
  });
  it("a + b * c and a ^ b * c and a + b ^ c group as the precedence says", () => {
    // expected tables by hand from the precedence rule above (NOT > AND > XOR > OR)
    const cases: [string, (a: boolean, b: boolean, c: boolean) => boolean][] = [
      ["a + b * c", (a, b, c) => a || (b && c)],
      ["a ^ b * c", (a, b, c) => a !== (b && c)],
      ["a + b ^ c", (a, b, c) => a || b !== c],
      ["a * b' ^ c", (a, b, c) => (a && !b) !== c],
      ["!a * b", (a, b) => !a && b],
    ];
    for (const [e, fn] of cases) {
      const src = `inputs a, b, c\noutputs f, all_\nf = ${e}\nall_ = a * b * c\n`;
      const want = Array.from({ length: 8 }, (_, m) => fn(...(envOf(m, 3) as [boolean, boolean, boolean])));
      expect(tableOfSource(src, 3), e).toEqual(want);
    }
  });
});

describe("De Morgan's laws", () => {
  // (x * y)' = x' + y' and (x + y)' = x' * y' for any x, y (from memory; standard Boolean algebra)
  it("hold for random sub-expressions in every NOT spelling", () => {
    fc.assert(
      fc.property(treeArb(3), treeArb(3), fc.array(fc.nat(5), { minLength: 1, maxLength: 4 }), (x, y, spell) => {
        const n = 3;
        const X = printTree(x, spell);
        const Y = printTree(y, spell);
        const pairs: [string, string][] = [
          [`(${X} * ${Y})'`, `!(${X}) + ~(${Y})`],
          [`~(${X} + ${Y})`, `(${X})' * (${Y})'`],
        ];
        for (const [l, r] of pairs) {
          const left = tableOfSource(designOf(l, n), n);
          const right = tableOfSource(designOf(r, n), n);
          expect(left).toEqual(right);
          // and against this file's own evaluation of the left side
          const own = Array.from({ length: 8 }, (_, m) => {
            const env = envOf(m, n);
            const vx = evalTree(x, env);
            const vy = evalTree(y, env);
            return l.startsWith("(") ? !(vx && vy) : !(vx || vy);
          });
          expect(left).toEqual(own);
        }
      }),
      { numRuns: 150 },
    );
  });
});

function lineLengths(src: string): number[] {
  return src.split("\n").map((l) => l.length);
}

function assertInside(src: string, d: { line: number; column: number; endLine: number; endColumn: number }) {
  const lens = lineLengths(src);
  expect(d.line).toBeGreaterThanOrEqual(1);
  expect(d.line).toBeLessThanOrEqual(lens.length);
  expect(d.endLine).toBeGreaterThanOrEqual(d.line);
  expect(d.endLine).toBeLessThanOrEqual(lens.length);
  expect(d.column).toBeGreaterThanOrEqual(1);
  expect(d.column).toBeLessThanOrEqual(lens[d.line - 1]! + 1);
  expect(d.endColumn).toBeLessThanOrEqual(lens[d.endLine - 1]! + 1);
  if (d.endLine === d.line) expect(d.endColumn).toBeGreaterThanOrEqual(d.column);
}

describe("robustness", () => {
  const pieces = [
    "inputs", "outputs", "let", "never", "block", "end", "use", "from", "at", "on", "off", "dc",
    "a", "b", "f", "g", "x1", "0", "1", "7", "12", "..", "=", "+", "|", "*", "&", "\u00b7", "^", "'", "!", "~",
    "(", ")", ",", "->", "\"lib\"", " ", " ", "\n", "\n", "// note", "#", "/", ".", "\r", "\t", "\u00e9", "-",
  ];
  const textArb = fc.oneof(
    fc.string({ maxLength: 120 }),
    fc.array(fc.constantFrom(...pieces), { maxLength: 60 }).map((xs) => xs.join("")),
    fc.array(fc.constantFrom(...pieces), { maxLength: 60 }).map((xs) => "inputs a, b\noutputs f, g\n" + xs.join(" ")),
  );
  it("never throws on any text and puts every diagnostic inside the source", () => {
    fc.assert(
      fc.property(textArb, (src) => {
        const r = compileSource(src);
        for (const d of r.diagnostics) assertInside(src, d);
        const f = formatSource(src);
        if ("diagnostics" in f) for (const d of f.diagnostics) assertInside(src, d);
        else expect(formatSource(f.text)).toEqual(f);
      }),
      { numRuns: 1500 },
    );
  });
  it("gives one error for one mistake, whatever the lines after it", () => {
    // common practice, no source: a broken line must not spill into its neighbours
    fc.assert(
      fc.property(fc.constantFrom("f = a +", "f = (a * b", "f = a b", "f = on(1,", "f = * a", "f = a #"), (bad) => {
        const src = `inputs a, b\noutputs f, g\n${bad}\ng = a * b'\n`;
        const errors = compileSource(src).diagnostics.filter((d) => d.severity === "error");
        expect(errors).toHaveLength(1);
        expect(errors[0]!.line).toBe(3);
      }),
    );
  });
  it("parses with no diagnostic at all for every line of a clean source", () => {
    expect(parseSource("inputs a\noutputs f\nf = a\n").diagnostics).toEqual([]);
  });
});
