// The exported Verilog is compiled and simulated with Icarus Verilog against
// truth tables the test computes itself (from the specification's ON/DC sets,
// and for two designs from reference functions written here); the VHDL is
// analysed and simulated with GHDL.
import { describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { compileNow, type DesignSettings } from "../../lib/pipeline/index";
import { BUILT_IN_FAMILIES } from "../../lib/families/index";

/** Settings with the built-in family they run on. */
type Case = DesignSettings & { familyId: string };
import { compileSource } from "../../lib/lang/index";
import { mapCovers, type Netlist, type TargetForm } from "../../lib/map/index";
import { toVerilog, toVhdl } from "../../lib/export/index";
import type { FunctionSpec, Cube } from "../../lib/logic/index";
import { cubeFromString } from "../../lib/logic/index";
import { ensureTool, run } from "./tools";

const haveIverilog = ensureTool("iverilog", "iverilog");
const haveGhdl = ensureTool("ghdl", "ghdl");
const dir = mkdtempSync(path.join(tmpdir(), "fanbound-hdl-"));
const example = (name: string) => readFileSync(path.join("lib/lang/examples", name), "utf8");

const inCube = (c: Cube, m: number) => ((m ^ c.value) & c.mask) === 0;

/** Expected value per output and minterm: 1, 0, or null for don't-care; from the spec's ON and DC cubes. */
function specTable(spec: FunctionSpec): (0 | 1 | null)[][] {
  const n = spec.inputs.length;
  return spec.outputs.map((o) =>
    Array.from({ length: 2 ** n }, (_, m) => (o.dc.some((c) => inCube(c, m)) ? null : o.on.some((c) => inCube(c, m)) ? 1 : 0)),
  );
}

/** A Verilog testbench applying every minterm and comparing with `table` (positional port order). */
function verilogBench(netlist: Netlist, table: (0 | 1 | null)[][], unit: string): string {
  const n = netlist.inputs.length;
  const N = 2 ** n;
  const outs = netlist.outputs.length;
  const lines = ["`timescale 1ns / 1ps", "module bench;", `  reg [${Math.max(n - 1, 0)}:0] x;`, `  wire [${outs - 1}:0] y;`, "  integer m, errors;"];
  for (let k = 0; k < outs; k++) {
    const exp = table[k]!.map((v) => (v === 1 ? "1" : "0")).join("");
    const care = table[k]!.map((v) => (v === null ? "0" : "1")).join("");
    lines.push(`  reg [0:${N - 1}] exp${k}, care${k};`);
    lines.push(`  initial begin exp${k} = ${N}'b${exp}; care${k} = ${N}'b${care}; end`);
  }
  const ins = netlist.inputs.map((_, i) => `x[${n - 1 - i}]`);
  const rails = netlist.complements.map((c) => `~x[${n - 1 - netlist.inputs.indexOf(c.input)}]`);
  const ys = netlist.outputs.map((_, k) => `y[${k}]`);
  lines.push(`  ${unit} dut(${[...ins, ...rails, ...ys].join(", ")});`);
  lines.push("  initial begin");
  lines.push("    errors = 0;");
  lines.push(`    for (m = 0; m < ${N}; m = m + 1) begin`);
  lines.push("      x = m; #1;");
  for (let k = 0; k < outs; k++) lines.push(`      if (care${k}[m] && y[${k}] !== exp${k}[m]) begin errors = errors + 1; $display("MISMATCH output ${k} minterm %0d", m); end`);
  lines.push("    end");
  lines.push('    $display("CHECKED %0d ERRORS %0d", m, errors);');
  lines.push("    $finish;");
  lines.push("  end");
  lines.push("endmodule");
  return lines.join("\n") + "\n";
}

function simulateVerilog(netlist: Netlist, table: (0 | 1 | null)[][], tag: string): string {
  const unit = `dut_${tag.replace(/[^A-Za-z0-9]/g, "_")}`;
  const v = path.join(dir, `${tag}.v`);
  const tb = path.join(dir, `${tag}_tb.v`);
  writeFileSync(v, toVerilog(netlist, { name: unit, header: [tag] }));
  writeFileSync(tb, verilogBench(netlist, table, unit));
  const c = run("iverilog", ["-g2005", "-Wall", "-o", `${tag}.vvp`, v, tb], dir);
  expect(c.ok, c.out).toBe(true);
  const s = run("vvp", ["-n", `${tag}.vvp`], dir);
  expect(s.ok, s.out).toBe(true);
  return s.out;
}

/** A VHDL-93/2008 testbench that drives every minterm and asserts the cared-for outputs. */
function vhdlBench(netlist: Netlist, table: (0 | 1 | null)[][], unit: string): string {
  const n = netlist.inputs.length;
  const N = 2 ** n;
  const outs = netlist.outputs.length;
  const lines = ["library ieee;", "use ieee.std_logic_1164.all;", "use ieee.numeric_std.all;", "entity bench is end entity;", "architecture run of bench is"];
  lines.push(`  signal x : std_logic_vector(${n - 1} downto 0);`, `  signal y : std_logic_vector(${outs - 1} downto 0);`);
  for (let k = 0; k < outs; k++) {
    lines.push(`  constant exp${k} : string(1 to ${N}) := "${table[k]!.map((v) => (v === null ? "-" : String(v))).join("")}";`);
  }
  // complemented rails come from a signal: an expression as a port actual is VHDL-2008 only
  lines.push(`  signal xn : std_logic_vector(${n - 1} downto 0);`, "  signal errors : natural := 0;", "begin", "  xn <= not x;");
  const ins = netlist.inputs.map((_, i) => `x(${n - 1 - i})`);
  const rails = netlist.complements.map((c) => `xn(${n - 1 - netlist.inputs.indexOf(c.input)})`);
  const ys = netlist.outputs.map((_, k) => `y(${k})`);
  lines.push(`  dut : entity work.${unit} port map (${[...ins, ...rails, ...ys].join(", ")});`);
  lines.push("  process", "    variable bad : natural := 0;", "  begin");
  lines.push(`    for m in 0 to ${N - 1} loop`);
  lines.push(`      x <= std_logic_vector(to_unsigned(m, ${n}));`, "      wait for 1 ns;");
  for (let k = 0; k < outs; k++) {
    lines.push(`      if exp${k}(m + 1) /= '-' and ((exp${k}(m + 1) = '1') /= (y(${k}) = '1')) then bad := bad + 1; report "MISMATCH output ${k} minterm " & integer'image(m); end if;`);
  }
  lines.push("    end loop;", '    report "ERRORS " & integer\'image(bad);', "    wait;", "  end process;", "end architecture;");
  return lines.join("\n") + "\n";
}

/**
 * Analyses and runs the design with its bench under each VHDL revision: GHDL's
 * default (no --std, which is VHDL-93 with relaxed rules), strict-ish 93c, and
 * 2008. VHDL-93 forbids reading an `out` port inside its architecture, so the
 * first two catch an exporter that relies on the 2008 relaxation (IEEE 1076-1993
 * §1.1.1.2 port modes, from memory). Returns the 2008 run's output; every run
 * must report the same verdict.
 */
function simulateVhdl(netlist: Netlist, table: (0 | 1 | null)[][], tag: string): string {
  const unit = `dut_${tag.replace(/[^A-Za-z0-9]/g, "_")}`;
  let last = "";
  for (const std of [null, "93c", "08"]) {
    const sub = mkdtempSync(path.join(dir, "vhdl-"));
    writeFileSync(path.join(sub, "design.vhd"), toVhdl(netlist, { name: unit, header: [tag] }));
    writeFileSync(path.join(sub, "bench.vhd"), vhdlBench(netlist, table, unit));
    const flags = std ? [`--std=${std}`] : [];
    const a = run("ghdl", ["-a", ...flags, "design.vhd", "bench.vhd"], sub);
    expect(a.ok, `ghdl -a ${flags.join(" ")}: ${a.out}`).toBe(true);
    const r = run("ghdl", ["--elab-run", ...flags, "bench"], sub);
    expect(r.ok, `ghdl --elab-run ${flags.join(" ")}: ${r.out}`).toBe(true);
    expect(r.out, `std ${std ?? "default"}`).toContain("ERRORS 0");
    last = r.out;
  }
  return last;
}

/** Analyses the design alone under one standard (null: GHDL's default). */
function analyseVhdl(text: string, std: string | null): { ok: boolean; out: string } {
  const sub = mkdtempSync(path.join(dir, "vhdl-a-"));
  writeFileSync(path.join(sub, "design.vhd"), text);
  return run("ghdl", ["-a", ...(std ? [`--std=${std}`] : []), "design.vhd"], sub);
}

const combos: { file: string; settings: Case }[] = [
  { file: "chamber-interlock.fnb", settings: { familyId: "ttl-std-5v", form: "nand" } },
  { file: "chamber-interlock.fnb", settings: { familyId: "cmos-hc-5v", form: "nor" } },
  { file: "fault-priority.fnb", settings: { familyId: "lvcmos-3v3", form: "and-or", fanIn: 2 } },
  { file: "fault-priority.fnb", settings: { familyId: "cmos-hct-5v", form: "mixed", fanOut: 3 } },
  { file: "level-display.fnb", settings: { familyId: "ttl-ls-5v", form: "or-and" } },
  { file: "level-display.fnb", settings: { familyId: "cmos-hc-5v", form: "nand", fanIn: 2, fanOut: 2, complementedInputs: true } },
  { file: "status-lamps.fnb", settings: { familyId: "cmos-hc-5v", form: "mixed" } },
  { file: "paddle-driver.fnb", settings: { familyId: "ttl-std-5v", form: "and-or", fanOut: 4, outputPinLoad: 2 } },
];

function design(file: string, { familyId, ...settings }: Case) {
  const family = BUILT_IN_FAMILIES.find((f) => f.id === familyId)!;
  const r = compileNow({ source: example(file), family, settings });
  expect(r.error, JSON.stringify(r.error ?? r.diagnostics)).toBeNull();
  return { netlist: r.result!.model, spec: r.spec! };
}

describe.skipIf(!haveIverilog)("Verilog simulated with Icarus Verilog", () => {
  for (const { file, settings } of combos) {
    it(`${file} on ${settings.familyId}, ${settings.form}`, () => {
      const { netlist, spec } = design(file, settings);
      const out = simulateVerilog(netlist, specTable(spec), `${file.replace(".fnb", "")}_${settings.form}_${settings.familyId}`);
      expect(out).toContain(`CHECKED ${2 ** spec.inputs.length} ERRORS 0`);
    });
  }

  it("the fault priority encoder names the most urgent active line", () => {
    // reference written here: f7 (bit 7 of the minterm) is the most urgent
    const { netlist, spec } = design("fault-priority.fnb", { familyId: "ttl-std-5v", form: "nand" });
    expect(spec.inputs).toEqual(["f7", "f6", "f5", "f4", "f3", "f2", "f1", "f0"]);
    const table: (0 | 1)[][] = [[], [], [], []];
    for (let m = 0; m < 256; m++) {
      const top = m === 0 ? 0 : 31 - Math.clz32(m);
      [(top >> 2) & 1, (top >> 1) & 1, top & 1, m ? 1 : 0].forEach((b, k) => table[k]!.push(b as 0 | 1));
    }
    expect(simulateVerilog(netlist, table, "priority_reference")).toContain("CHECKED 256 ERRORS 0");
  });

  it("the level display lights the usual segments for 0 to 9", () => {
    // common practice (from memory): segment patterns gfedcba of a 7-segment digit; codes 10–15 never occur
    const SEG = [0x3f, 0x06, 0x5b, 0x4f, 0x66, 0x6d, 0x7d, 0x07, 0x7f, 0x6f];
    const { netlist } = design("level-display.fnb", { familyId: "cmos-hc-5v", form: "mixed" });
    expect(netlist.outputs.map((o) => o.name)).toEqual(["seg_a", "seg_b", "seg_c", "seg_d", "seg_e", "seg_f", "seg_g"]);
    const table = Array.from({ length: 7 }, (_, k) => Array.from({ length: 16 }, (_, m) => (m > 9 ? null : ((SEG[m]! >> k) & 1) as 0 | 1)));
    expect(simulateVerilog(netlist, table, "segments_reference")).toContain("CHECKED 16 ERRORS 0");
  });

  it("keeps awkward names legal: keywords, constants, aliases, rails, buffers, tied inputs", () => {
    const inputs = ["wire", "signal", "Gate", "gate", "in_1"];
    const spec: FunctionSpec = {
      inputs,
      outputs: [
        { name: "out", on: ["11---", "--11-", "0---1"].map(cubeFromString), dc: [] },
        { name: "module", on: ["11111"].map(cubeFromString), dc: [] },
        { name: "always_on", on: ["-----"].map(cubeFromString), dc: [] },
        { name: "Out2", on: ["1----"].map(cubeFromString), dc: [] },
        { name: "copy", on: ["11---", "--11-", "0---1"].map(cubeFromString), dc: [] },
      ],
    };
    const covers = { inputs, outputs: spec.outputs.map((o) => ({ name: o.name, form: "sop" as const, cubes: o.on })) };
    const fam = { id: "gappy", name: "Gappy", fanOut: 2, gates: [{ type: "NAND" as const, widths: [{ width: 2, perPackage: 4 }, { width: 8, perPackage: 1 }] }, { type: "NOT" as const, widths: [{ width: 1, perPackage: 6 }] }, { type: "BUF" as const, widths: [{ width: 1, perPackage: 6 }] }] };
    for (const [form, rails] of [["nand", false], ["nand", true]] as [TargetForm, boolean][]) {
      const r = mapCovers(covers, fam, { form, complementedInputs: rails, spec });
      expect(r.netlist.gates.some((g) => g.type === "BUF")).toBe(true);
      expect(r.netlist.gates.some((g) => g.inputs.includes("1"))).toBe(true);
      const v = toVerilog(r.netlist);
      expect(v).toContain("\\wire ");
      expect(simulateVerilog(r.netlist, specTable(spec), `awkward_${rails}`)).toContain("CHECKED 32 ERRORS 0");
      if (haveGhdl) expect(simulateVhdl(r.netlist, specTable(spec), `awkward_${rails}`)).toContain("ERRORS 0");
    }
  });
});

describe.skipIf(!haveGhdl)("VHDL analysed and simulated with GHDL", () => {
  it("outputs that copy an input or share a gate analyse under VHDL-93 and VHDL-2008", () => {
    // the reviewer's failing case: f = a, g = a, h = b', k = b'. IEEE 1076-1993 (from memory):
    // an `out` port may not be read in its architecture, so h must not feed k directly.
    const inputs = ["a", "b"];
    const spec: FunctionSpec = {
      inputs,
      outputs: [
        { name: "f", on: [cubeFromString("1-")], dc: [] },
        { name: "g", on: [cubeFromString("1-")], dc: [] },
        { name: "h", on: [cubeFromString("-0")], dc: [] },
        { name: "k", on: [cubeFromString("-0")], dc: [] },
      ],
    };
    const covers = { inputs, outputs: spec.outputs.map((o) => ({ name: o.name, form: "sop" as const, cubes: o.on })) };
    const r = mapCovers(covers, { id: "bench-rule", name: "Bench rule", fanIn: 2, fanOut: 4 }, { form: "and-or", spec });
    // the case only tests something if one output's net is another output's name (k reads h's gate)
    expect(r.netlist.outputs.some((o) => o.net !== o.name && r.netlist.outputs.some((p) => p.name === o.net))).toBe(true);
    const text = toVhdl(r.netlist, { name: "copy_outputs" });
    for (const std of [null, "93c", "08"]) {
      const a = analyseVhdl(text, std);
      expect(a.ok, `ghdl -a ${std ?? "(default)"}: ${a.out}\n${text}`).toBe(true);
    }
    // the truth table written here: f = g = a, h = k = not b (minterm bits a b)
    const table: (0 | 1)[][] = [[0, 0, 1, 1], [0, 0, 1, 1], [1, 0, 1, 0], [1, 0, 1, 0]];
    expect(simulateVhdl(r.netlist, table, "copy_outputs")).not.toContain("MISMATCH");
  });

  for (const { file, settings } of combos.slice(0, 5)) {
    it(`${file} on ${settings.familyId}, ${settings.form}`, () => {
      const { netlist, spec } = design(file, settings);
      const out = simulateVhdl(netlist, specTable(spec), `${file.replace(".fnb", "")}_${settings.form}`);
      expect(out).toContain("ERRORS 0");
      expect(out).not.toContain("MISMATCH");
    });
  }
});

it("compiles the example designs", () => {
  // guards the test data itself: the examples must compile
  for (const f of ["chamber-interlock.fnb", "fault-priority.fnb", "level-display.fnb"]) expect(compileSource(example(f)).spec).not.toBeNull();
});
