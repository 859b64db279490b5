import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { run as mapRun } from "../../lib/cli/commands/map";
import { run as familiesRun } from "../../lib/cli/commands/families";
import { compileSource } from "../../lib/lang/index";
import { evalNetlist } from "./helpers";
import type { Netlist } from "../../lib/map/index";

const INTERLOCK = readFileSync("lib/lang/examples/chamber-interlock.fnb", "utf8");

function io(source = INTERLOCK) {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { readSource: () => source, out: (t: string) => out.push(t), err: (t: string) => err.push(t) }, out, err };
}

describe("map command", () => {
  it("prints the JSON netlist with the documented fields", async () => {
    const t = io();
    expect(await mapRun(["design.fnb", "--family", "ttl-std-5v", "--form", "nand"], t.io)).toBe(0);
    const doc = JSON.parse(t.out.join(""));
    // the documented CLI shape, plus the caution that goes with its delay and power figures
    expect(Object.keys(doc).sort()).toEqual(["caution", "gates", "inputs", "outputs", "stats", "warnings"]);
    expect(Object.keys(doc.stats).sort()).toEqual(["byType", "criticalPathNs", "depth", "dynamicMw", "gates", "maxLoad", "packages", "staticMw", "transistors"]);
    expect(doc.caution).toMatch(/data sheets/);
    for (const g of doc.gates) expect(["NAND", "NOT", "BUF"]).toContain(g.type);
    expect(doc.stats.gates).toBe(doc.gates.length);
    // the netlist equals the compiled specification on every care minterm (reference evaluation here)
    const spec = compileSource(INTERLOCK).spec!;
    const net: Netlist = { inputs: doc.inputs, outputs: doc.outputs, gates: doc.gates.map((g: object) => ({ ...g, role: "logic" })), complements: [] };
    const n = spec.inputs.length;
    const inCube = (c: { value: number; mask: number }, m: number) => ((m ^ c.value) & c.mask) === 0;
    for (let m = 0; m < 2 ** n; m++) {
      const v = evalNetlist(net, spec.inputs, m);
      for (const o of spec.outputs) {
        if (o.dc.some((c) => inCube(c, m))) continue;
        expect(v.get(doc.outputs.find((x: { name: string }) => x.name === o.name).net)).toBe(o.on.some((c) => inCube(c, m)));
      }
    }
  });
  it("--fanin and --fanout override the family's limits", async () => {
    const t = io();
    expect(await mapRun(["d", "--family", "ttl-std-5v", "--fanin", "2", "--fanout", "2"], t.io)).toBe(0);
    const doc = JSON.parse(t.out.join(""));
    for (const g of doc.gates) expect(g.inputs.length).toBeLessThanOrEqual(2);
    expect(doc.stats.maxLoad).toBeLessThanOrEqual(2);
  });
  it("prints Verilog, VHDL and CSV on request", async () => {
    for (const [format, mark] of [["verilog", "endmodule"], ["vhdl", "end architecture"], ["csv", "id,type,width"]]) {
      const t = io();
      expect(await mapRun(["chamber.fnb", "--family", "cmos-hc-5v", `--format=${format}`], t.io)).toBe(0);
      expect(t.out.join("")).toContain(mark);
    }
  });
  it("--multilevel prints the factored netlist in the same JSON format, equal to the specification", async () => {
    for (const aim of [[], ["--aim", "levels"]]) {
      const t = io();
      expect(await mapRun(["design.fnb", "--family", "cmos-hc-5v", "--multilevel", ...aim], t.io)).toBe(0);
      const doc = JSON.parse(t.out.join(""));
      expect(Object.keys(doc).sort()).toEqual(["caution", "gates", "inputs", "outputs", "stats", "warnings"]);
      expect(doc.stats.gates).toBe(doc.gates.length);
      // the netlist equals the compiled specification on every care minterm (reference evaluation here)
      const spec = compileSource(INTERLOCK).spec!;
      const net: Netlist = { inputs: doc.inputs, outputs: doc.outputs, gates: doc.gates.map((g: object) => ({ ...g, role: "logic" })), complements: [] };
      const inCube = (c: { value: number; mask: number }, m: number) => ((m ^ c.value) & c.mask) === 0;
      for (let m = 0; m < 2 ** spec.inputs.length; m++) {
        const v = evalNetlist(net, spec.inputs, m);
        for (const o of spec.outputs) {
          if (o.dc.some((c) => inCube(c, m))) continue;
          expect(v.get(doc.outputs.find((x: { name: string }) => x.name === o.name).net)).toBe(o.on.some((c) => inCube(c, m)));
        }
      }
    }
    const bad = io();
    expect(await mapRun(["d", "--family", "cmos-hc-5v", "--multilevel", "--aim", "speed"], bad.io)).toBe(2);
    expect(bad.err.join("")).toMatch(/--aim takes gates or levels/);
    const alone = io();
    expect(await mapRun(["d", "--family", "cmos-hc-5v", "--aim", "levels"], alone.io)).toBe(2);
    expect(alone.err.join("")).toMatch(/add --multilevel/);
  });
  it("an unknown family is a clear error listing the ids, exit 2", async () => {
    const t = io();
    expect(await mapRun(["d", "--family", "valve-logic"], t.io)).toBe(2);
    expect(t.err.join("")).toMatch(/unknown family "valve-logic"; the families are: ttl-std-5v, .*lvcmos-3v3/);
  });
  it("bad options exit 2 with the usage", async () => {
    for (const args of [["d"], ["d", "--family", "ttl-std-5v", "--form", "pla"], ["d", "--family", "ttl-std-5v", "--fanin", "1"], ["--family", "ttl-std-5v"]]) {
      const t = io();
      expect(await mapRun(args, t.io)).toBe(2);
      expect(t.err.join("")).toMatch(/usage/);
    }
  });
  it("language errors print diagnostics and exit 1", async () => {
    const t = io("inputs a\noutputs f\nf = a +\n");
    expect(await mapRun(["d", "--family", "ttl-std-5v"], t.io)).toBe(1);
    expect(JSON.parse(t.out.join("")).diagnostics.length).toBeGreaterThan(0);
  });
});

describe("families command", () => {
  it("lists every built-in family with id, name, fan-in and fan-out", async () => {
    const t = io();
    expect(await familiesRun([], t.io)).toBe(0);
    const { families } = JSON.parse(t.out.join(""));
    const ttl = families.find((f: { id: string }) => f.id === "ttl-std-5v");
    // handbook table: standard TTL fan-out 10; widest NAND on offer 13 inputs (from memory)
    expect(ttl).toMatchObject({ name: "Bipolar TTL, standard, 5 V", fanOut: 10, fanIn: 13 });
    for (const f of families) expect(typeof f.fanIn === "number" && typeof f.fanOut === "number").toBe(true);
  });
  it("--matrix prints every driver → receiver pair of the built-in families", async () => {
    const t = io();
    expect(await familiesRun(["--matrix"], t.io)).toBe(0);
    const { pairs } = JSON.parse(t.out.join(""));
    expect(pairs.length).toBe(25); // five built-in families, each with each, itself included
    for (const p of pairs) expect(Object.keys(p).sort()).toEqual(["driver", "fanOutHigh", "fanOutLow", "nmhV", "nmlV", "receiver", "verdict"]);
    // textbook standard TTL into itself: 0.4 V and 0.4 V; IOL 16 mA / IIL 1.6 mA = 10, IOH 0.4 mA / IIH 40 µA = 10
    expect(pairs.find((p: { driver: string; receiver: string }) => p.driver === "ttl-std-5v" && p.receiver === "ttl-std-5v")).toEqual({
      driver: "ttl-std-5v", receiver: "ttl-std-5v", nmhV: 0.4, nmlV: 0.4, fanOutHigh: 10, fanOutLow: 10, verdict: "compatible",
    });
    // TTL VOH(min) 2.4 V below the 3.15 V CMOS threshold of JEDEC JESD7A at VCC = 4.5 V
    expect(pairs.find((p: { driver: string; receiver: string }) => p.driver === "ttl-std-5v" && p.receiver === "cmos-hc-5v").verdict).toBe("not-compatible");
    const bad = io();
    expect(await familiesRun(["--matrx"], bad.io)).toBe(2);
    expect(bad.err.join("")).toMatch(/usage: .*families \[--matrix\]/);
  });
});

describe("through npm run", () => {
  it("families --matrix runs from the command line", () => {
    const r = spawnSync("npm", ["run", "-s", "cli", "--", "families", "--matrix"], { encoding: "utf8" });
    expect(r.status, r.stderr).toBe(0);
    const { pairs } = JSON.parse(r.stdout);
    // JESD7A 4 mA rated point into textbook standard TTL inputs: floor(4 / 1.6) = 2 low, floor(4 / 0.04) = 100 high
    expect(pairs.find((p: { driver: string; receiver: string }) => p.driver === "cmos-hc-5v" && p.receiver === "ttl-std-5v")).toMatchObject({ fanOutLow: 2, fanOutHigh: 100, verdict: "compatible" });
  });
  it("map runs from the command line", () => {
    const r = spawnSync("npm", ["run", "-s", "cli", "--", "map", "lib/lang/examples/fault-priority.fnb", "--family", "lvcmos-3v3", "--form", "nor"], { encoding: "utf8" });
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.inputs).toEqual(["f7", "f6", "f5", "f4", "f3", "f2", "f1", "f0"]);
    for (const g of doc.gates) expect(["NOR", "NOT", "BUF"]).toContain(g.type);
  });
});
