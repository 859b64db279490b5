// The formatter on whole random programs: comments, blank lines, blocks,
// continuation lines and every operator spelling. Formatting must reach a
// fixed point at once and keep every output's ON-set and DC-set.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSource, formatSource } from "../../lib/lang/index";
import type { FunctionSpec } from "../../lib/logic/index";

type E = { k: "ref"; n: string } | { k: "not"; a: E } | { k: "op"; op: "and" | "or" | "xor"; a: E; b: E };

const exprArb = (names: string[]) =>
  fc.letrec<{ e: E }>((tie) => ({
    e: fc.oneof(
      { depthSize: "small" },
      fc.constantFrom(...names).map((n): E => ({ k: "ref", n })),
      tie("e").map((a): E => ({ k: "not", a })),
      fc.record({ k: fc.constant("op" as const), op: fc.constantFrom("and" as const, "or" as const, "xor" as const), a: tie("e"), b: tie("e") }),
    ),
  })).e;

function render(e: E, choice: number[]): string {
  let i = 0;
  const pick = () => choice[i++ % choice.length]!;
  const go = (x: E): string => {
    if (x.k === "ref") return x.n;
    if (x.k === "not") return [`(${go(x.a)})'`, `!(${go(x.a)})`, `~(${go(x.a)})`][pick() % 3]!;
    const sym = x.op === "and" ? ["*", "&", "\u00b7"][pick() % 3] : x.op === "or" ? ["+", "|"][pick() % 2] : "^";
    const brk = pick() % 5 === 0 ? "\n      " : " ";
    return `(${go(x.a)} ${sym}${brk}${go(x.b)})`;
  };
  return go(e);
}

const programArb = fc
  .record({
    lets: fc.array(exprArb(["a", "b", "c", "d"]), { maxLength: 3 }),
    p: exprArb(["x", "y"]),
    q: exprArb(["x", "y"]),
    outs: fc.array(exprArb(["a", "b", "c", "d", "u", "v"]), { minLength: 1, maxLength: 3 }),
    lists: fc.array(fc.nat(15), { maxLength: 5 }),
    choice: fc.array(fc.nat(30), { minLength: 1, maxLength: 8 }),
    comments: fc.array(fc.nat(6), { minLength: 1, maxLength: 12 }),
    never: fc.boolean(),
  })
  .map((r) => {
    let c = 0;
    const deco = () => {
      const k = r.comments[c++ % r.comments.length]!;
      return k === 0 ? "   // note" : "";
    };
    const gap = () => {
      const k = r.comments[c++ % r.comments.length]!;
      return k === 1 ? "\n\n\n" : k === 2 ? "\n// a remark\n" : k === 3 ? "\n   \n" : "\n";
    };
    const outNames = r.outs.map((_, k) => `f${k}`);
    let src = `// random design${gap()}inputs a, b, c, d${deco()}${gap()}outputs ${[...outNames, "g"].join(", ")}${gap()}`;
    src += `block blk(x, y) -> (p, q)${deco()}${gap()}  p = ${render(r.p, r.choice)}${deco()}\n  // inside\n  q = ${render(r.q, r.choice)}\nend${deco()}${gap()}`;
    src += `let (u, v) = blk(a, b)${gap()}`;
    r.lets.forEach((e, k) => (src += `let t${k} = ${render(e, r.choice)}${deco()}${gap()}`));
    r.outs.forEach((e, k) => {
      const uses = r.lets.map((_, j) => ` ^ t${j}`).join("");
      src += `f${k} = ${render(e, r.choice)}${k === 0 ? uses : ""}${deco()}${gap()}`;
    });
    const lists = [...new Set(r.lists)];
    src += `g = on(${lists.join(", ")})${gap()}`;
    if (r.never) src += `never a * b'${deco()}\n`;
    return src;
  });

function tables(spec: FunctionSpec) {
  const n = spec.inputs.length;
  const member = (cs: { value: number; mask: number }[], m: number) => cs.some((x) => ((m ^ x.value) & x.mask) === 0);
  return spec.outputs.map((o) => ({
    name: o.name,
    on: [...Array(2 ** n).keys()].filter((m) => member(o.on, m)),
    dc: [...Array(2 ** n).keys()].filter((m) => member(o.dc, m)),
  }));
}

describe("formatter on random programs", () => {
  it("reaches a fixed point in one pass and keeps every function", () => {
    fc.assert(
      fc.property(programArb, (src) => {
        const before = compileSource(src);
        expect(before.diagnostics.filter((d) => d.severity === "error")).toEqual([]);
        const once = formatSource(src);
        if (!("text" in once)) throw new Error("did not format: " + JSON.stringify(once));
        expect(formatSource(once.text)).toEqual(once);
        const after = compileSource(once.text);
        // warnings move with the text, so only their messages are compared
        expect(after.diagnostics.map((d) => d.message).sort()).toEqual(before.diagnostics.map((d) => d.message).sort());
        expect(tables(after.spec!)).toEqual(tables(before.spec!));
        // every comment survives
        expect(once.text.split("// note").length).toBe(src.split("// note").length);
        expect(once.text.split("// a remark").length).toBe(src.split("// a remark").length);
        expect(once.text).toContain("  // inside");
      }),
      { numRuns: 300 },
    );
  });
});
