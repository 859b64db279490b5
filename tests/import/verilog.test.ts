// Verilog import. The outside reference is Icarus Verilog: each module is
// simulated exhaustively (every input combination) and its outputs compared
// with our elaboration of the imported source. Random modules come from
// fast-check; the precedence cases follow IEEE 1364-2005 table 5-4 (unary ~
// first, then binary &, then ^ ~^ ^~, then |).
import fc from "fast-check";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { importVerilog, type ImportDiagnostic } from "../../lib/import/index";
import { ensureTool, run } from "../export/tools";
import { bruteTable, specOf } from "./helpers";

const haveIverilog = ensureTool("iverilog", "iverilog");
const dir = mkdtempSync(path.join(tmpdir(), "fanbound-import-"));
let serial = 0;

/**
 * Simulates `module` (whose inputs and outputs are named) for every input
 * combination with Icarus Verilog; returns per output the string of values by
 * minterm (first input = most significant bit, as in the language).
 */
function simulate(verilog: string, moduleName: string, inputs: string[], outputs: string[]): string[] {
  const tag = `m${serial++}`;
  const n = inputs.length;
  const bench = [
    "module bench;",
    `  reg [${n - 1}:0] x;`,
    ...outputs.map((o) => `  wire o_${o};`),
    `  ${moduleName} dut(${[...inputs.map((name, i) => `.${name}(x[${n - 1 - i}])`), ...outputs.map((o) => `.${o}(o_${o})`)].join(", ")});`,
    "  integer m;",
    "  initial begin",
    `    for (m = 0; m < ${2 ** n}; m = m + 1) begin`,
    "      x = m; #1;",
    `      $display("ROW %0d ${outputs.map(() => "%b").join("")}", m, ${outputs.map((o) => `o_${o}`).join(", ")});`,
    "    end",
    "    $finish;",
    "  end",
    "endmodule",
  ].join("\n");
  writeFileSync(path.join(dir, `${tag}.v`), verilog);
  writeFileSync(path.join(dir, `${tag}_tb.v`), bench);
  const c = run("iverilog", ["-g2005", "-o", `${tag}.vvp`, `${tag}.v`, `${tag}_tb.v`], dir);
  expect(c.ok, c.out + "\n" + verilog).toBe(true);
  const s = run("vvp", ["-n", `${tag}.vvp`], dir);
  expect(s.ok, s.out).toBe(true);
  const values = outputs.map(() => Array.from({ length: 2 ** n }, () => "?"));
  for (const line of s.out.split("\n")) {
    const m = /^ROW (\d+) ([01xz]+)$/.exec(line.trim());
    if (!m) continue;
    [...m[2]!].forEach((v, k) => (values[k]![Number(m[1])] = v));
  }
  return values.map((v) => v.join(""));
}

/** Imports, compiles and compares with the simulation of the same file. */
function checkAgainstIverilog(verilog: string) {
  const r = importVerilog(verilog);
  expect(r.diagnostics.filter((d) => d.severity === "error"), verilog).toEqual([]);
  const spec = specOf(r.source!);
  const mod = /module\s+(\w+)/.exec(verilog)![1]!;
  const sim = simulate(verilog, mod, r.inputs, r.outputs);
  expect(bruteTable(spec).map((t) => t.join("")), `${verilog}\n---\n${r.source}`).toEqual(sim);
  return r;
}

describe.skipIf(!haveIverilog)("Verilog import against Icarus Verilog simulation", () => {
  it("keeps IEEE 1364 precedence: ~ before &, & before ^ and ~^, ^ before |", () => {
    const r = checkAgainstIverilog(`module prec(a, b, c, d, y0, y1, y2, y3, y4, y5, y6);
  input a, b, c, d;
  output y0, y1, y2, y3, y4, y5, y6;
  assign y0 = a | b & c;        // a | (b & c)
  assign y1 = a ^ b & c;        // a ^ (b & c)
  assign y2 = a | b ^ c;        // a | (b ^ c)
  assign y3 = ~a & b | c ~^ d;  // ((~a) & b) | (c ~^ d)
  assign y4 = a ~^ b ^ c;       // (a ~^ b) ^ c, left to right
  assign y5 = a ^~ b & ~c | d;
  assign y6 = ~(a | b) & ~(~c) ^ 1'b1 | 1'b0;
endmodule
`);
    expect(r.source).toContain("y0 = a + b * c\n");
    expect(r.source).toContain("y4 = (a ^ b)' ^ c\n");
  });

  it("reads the Ferrow weir horn module shipped with the demo", () => {
    const text = readFileSync("lib/import/examples/weir-horn.v", "utf8");
    const r = checkAgainstIverilog(text);
    expect(r.inputs).toEqual(["sluice_open", "pound_high", "flow", "override_key"]);
    expect(r.outputs).toEqual(["lamp", "horn"]);
    expect(r.source).toContain("let blocked = sluice_open * flow'\n");
  });

  it("keeps port order, reads non-ANSI ports, net declaration assignments, outputs read back and assign lists", () => {
    const r = checkAgainstIverilog(`/* header comment */
module gates(y, c, a, z, b);
  output y, z;
  input c;
  input wire a, b;
  wire y;
  wire t = a & b, u = ~t;
  assign y = u | c, z = y ^ a;
endmodule
`);
    expect(r.inputs).toEqual(["c", "a", "b"]);
    expect(r.outputs).toEqual(["y", "z"]);
  });

  it("agrees with the simulation on random modules", () => {
    type T = { k: "v"; i: number } | { k: "c"; v: 0 | 1 } | { k: "not"; a: T } | { k: "&" | "|" | "^" | "~^" | "^~"; a: T; b: T };
    const tree: fc.Arbitrary<T> = fc.letrec<{ t: T }>((tie) => ({
      t: fc.oneof(
        { depthSize: "small", withCrossShrink: true },
        fc.record({ k: fc.constant("v" as const), i: fc.nat(4) }),
        fc.record({ k: fc.constant("c" as const), v: fc.constantFrom(0 as const, 1 as const) }),
        fc.record({ k: fc.constant("not" as const), a: tie("t") }),
        fc.record({ k: fc.constantFrom("&" as const, "|" as const, "^" as const, "~^" as const, "^~" as const), a: tie("t"), b: tie("t") }),
      ),
    })).t;
    // Printed with parentheses only sometimes, so Verilog's own precedence decides the rest.
    const print = (t: T, paren: boolean[], at = { i: 0 }): string => {
      const wrap = (s: string) => (paren[at.i++ % paren.length] ? `(${s})` : s);
      switch (t.k) {
        case "v": return `i${t.i}`;
        case "c": return `1'b${t.v}`;
        case "not": return `~${t.a.k === "v" || t.a.k === "c" ? print(t.a, paren, at) : `(${print(t.a, paren, at)})`}`;
        default: return wrap(`${print(t.a, paren, at)} ${t.k} ${print(t.b, paren, at)}`);
      }
    };
    let cases = 0;
    fc.assert(
      fc.property(fc.array(tree, { minLength: 1, maxLength: 3 }), fc.array(fc.boolean(), { minLength: 1, maxLength: 8 }), fc.boolean(), (exprs, paren, ansi) => {
        const body = exprs.map((e, k) => `  assign o${k} = ${print(e, paren)};`);
        const used = new Set(exprs.flatMap((_, k) => [...body[k]!.matchAll(/i(\d)/g)].map((m) => Number(m[1]))));
        const inputs = [0, 1, 2, 3, 4].filter((i) => used.has(i)).map((i) => `i${i}`);
        if (inputs.length === 0) inputs.push("i0");
        const outs = exprs.map((_, k) => `o${k}`);
        const text = ansi
          ? `module rnd${cases}(input ${inputs.join(", ")}, output ${outs.join(", ")});\n${body.join("\n")}\nendmodule\n`
          : `module rnd${cases}(${[...inputs, ...outs].join(", ")});\n  input ${inputs.join(", ")};\n  output ${outs.join(", ")};\n${body.join("\n")}\nendmodule\n`;
        cases++;
        checkAgainstIverilog(text);
      }),
      { numRuns: 40 },
    );
  });
});

/** The only error of a refused import. */
function refusal(text: string): ImportDiagnostic {
  const r = importVerilog(text);
  expect(r.source).toBeNull();
  const errors = r.diagnostics.filter((d) => d.severity === "error");
  expect(errors, JSON.stringify(r.diagnostics)).toHaveLength(1);
  return errors[0]!;
}

const wrapBody = (body: string) => `module m(input a, input b, output y);\n${body}\nendmodule\n`;

describe("Verilog refusals name the construct at its line and column", () => {
  const cases: Array<[string, string, number, number, string]> = [
    ["a vector port", "module m(input [3:0] a, output y);\nassign y = a;\nendmodule\n", 1, 16, "vector ports ([msb:lsb]) are outside the imported subset: every port is one bit"],
    ["a vector wire", wrapBody("wire [1:0] w;\nassign y = a;"), 2, 6, "vector wires ([msb:lsb]) are outside the imported subset: every wire is one bit"],
    ["an always block", wrapBody("always @(a) y = a;"), 2, 1, "always blocks are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["an initial block", wrapBody("assign y = a;\ninitial begin\n  $display(a);\nend"), 3, 1, "initial blocks are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["a reg", wrapBody("reg r;\nassign y = a;"), 2, 1, "reg variables are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["a module instance", wrapBody("assign y = a;\nlatch u1(a, b);"), 3, 1, "an instance of module latch is outside the imported subset; import a flat module of assign statements"],
    ["a gate instance", wrapBody("and g1(y, a, b);"), 2, 1, "gate instances (and) are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["a delay", wrapBody("assign #5 y = a;"), 2, 8, "delays (#) are outside the imported subset: the import reads logic, not timing"],
    ["a parameter", wrapBody("parameter W = 1;\nassign y = a;"), 2, 1, "parameters are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["a function", wrapBody("function f;\ninput q;\nf = q;\nendfunction\nassign y = a;"), 2, 1, "functions are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); the module body takes input, output and wire declarations and assign statements"],
    ["an assign to a bit-select", wrapBody("assign y[0] = a;"), 2, 9, "an assignment to a bit-select (y[...]) is outside the imported subset: signals are one bit wide"],
    ["a bit-select read", wrapBody("assign y = a[0];"), 2, 13, "a bit-select or part-select (a[...]) is outside the imported subset: signals are one bit wide"],
    ["a concatenation", wrapBody("assign y = {a};"), 2, 12, "a concatenation is outside the imported subset (~, &, ^, ~^, | and parentheses)"],
    ["a logical operator", wrapBody("assign y = a && b;"), 2, 14, "the logical AND operator && is outside the imported subset (~, &, ^, ~^, | and parentheses)"],
    ["the conditional operator", wrapBody("assign y = a ? b : 1'b0;"), 2, 14, "the conditional operator ? : is outside the imported subset (~, &, ^, ~^, | and parentheses)"],
    ["a reduction operator", wrapBody("assign y = &a;"), 2, 12, "the reduction operator & is outside the imported subset (the signals are one bit wide: write the operand itself, or ~ for the inverted forms)"],
    ["a wide constant", wrapBody("assign y = 2'b01;"), 2, 12, "the constant 2'b01 is 2 bits wide; signals are one bit wide here: write 1'b0 or 1'b1"],
    ["an unsized number", wrapBody("assign y = 1;"), 2, 12, "the number 1 has no size and base; write 1'b0 or 1'b1"],
    ["two unary operators in a row", wrapBody("assign y = ~~a;"), 2, 13, "two ~ in a row are not Verilog (a unary operator takes a primary); write ~(~x)"],
    ["an x constant", wrapBody("assign y = 1'bx;"), 2, 12, "the constant 1'bx holds an unknown (x) or high-impedance (z) bit; design sources have only 0 and 1: write 1'b0 or 1'b1"],
    ["a second module", "module m(input a, output y);\nassign y = a;\nendmodule\nmodule n(input a, output y);\nassign y = a;\nendmodule\n", 4, 1, "a second module starts here; import one module per file"],
    ["module parameters", "module m #(parameter W = 1) (input a, output y);\nassign y = a;\nendmodule\n", 1, 10, "module parameters (#(...)) are outside the imported subset"],
    ["an inout port", "module m(input a, inout y);\nendmodule\n", 1, 19, "inout ports are outside the imported subset (continuous assign over one-bit inputs, outputs and wires); ports are input or output, one bit each"],
    ["a `define", "`define W 1\nmodule m(input a, output y);\nassign y = a;\nendmodule\n", 1, 1, "the compiler directive `define is outside the imported subset; the file must start with module (comments and `timescale may come first)"],
    ["an unclosed comment", "module m(input a, output y); /* note\nassign y = a;\nendmodule\n", 1, 30, "this /* comment is never closed; end it with */"],
    ["an output assigned twice", wrapBody("assign y = a;\nassign y = b;"), 3, 8, "y is already assigned at line 2; each output and wire gets exactly one assignment"],
    ["an input assigned", wrapBody("assign a = b;\nassign y = a;"), 2, 8, "a is an input and cannot be assigned; assign an output or a wire"],
    ["an output never assigned", "module m(input a, output y, output z);\nassign y = a;\nendmodule\n", 1, 36, "the output z is never assigned; give it an assign statement"],
    ["an undeclared name", wrapBody("assign y = a & q;"), 2, 16, "q is not declared; declare it as an input or a wire (implicit nets are not imported)"],
    ["a loop", wrapBody("wire p, q;\nassign p = q & a;\nassign q = p | b;\nassign y = p;"), 3, 8, "the assignments form a loop (p → q → p); combinational logic cannot depend on itself"],
    ["a reserved word of our language", "module m(input on, output y);\nassign y = on;\nendmodule\n", 1, 16, "the name on is a reserved word of the Fanbound language; rename the signal in the Verilog file (for example on_sig)"],
    ["no module", "// nothing here\n", 2, 1, "the file has no module; import a file with one module of assign statements"],
    ["a missing endmodule", "module m(input a, output y);\nassign y = a;\n", 3, 1, "the module has no endmodule; end it with endmodule"],
  ];
  for (const [what, text, line, column, message] of cases) {
    it(what, () => {
      const d = refusal(text);
      expect({ line: d.line, column: d.column, message: d.message }).toEqual({ line, column, message });
    });
  }

  it("reports several constructs at once, one per item, and imports nothing", () => {
    const r = importVerilog(wrapBody("reg r;\nassign y = a && b;\nalways @(a) begin r = a; end\nassign y = 1;"));
    expect(r.source).toBeNull();
    expect(r.diagnostics.map((d) => d.line)).toEqual([2, 3, 4, 5]);
  });

  it("never throws on random text", () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (s) => {
        const r = importVerilog(`module m(input a, output y);\n${s}\nendmodule\n`);
        expect(r.source === null ? r.diagnostics.length > 0 : true).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});
