import { describe, expect, it } from "vitest";
import { mapCovers, type CoverSet } from "../../lib/map/index";
import { analyse } from "../../lib/analysis/index";
import { builtInFamily } from "../../lib/families/index";
import { layoutNetlist, toCsv, toJsonDocument, verilogName, vhdlNamer, unitName } from "../../lib/export/index";
import { cubeFromString } from "../../lib/logic/index";

const covers: CoverSet = {
  inputs: ["gate_shut", "level_eq", "key", "estop"],
  outputs: [
    { name: "permit", form: "sop", cubes: ["11-0", "--10"].map(cubeFromString) },
    { name: "alarm", form: "sop", cubes: ["---1", "01--"].map(cubeFromString) },
    { name: "lamp", form: "sop", cubes: ["11-0", "--10"].map(cubeFromString) },
  ],
};
const fam = builtInFamily("ttl-std-5v")!;
const mapped = mapCovers(covers, fam, { form: "nand" });

describe("CSV gate list", () => {
  it("has one RFC 4180 row per gate that reads back to the netlist", () => {
    const csv = toCsv(mapped.netlist);
    const rows = csv.trimEnd().split("\r\n").map((r) => r.split(","));
    expect(rows[0]).toEqual(["id", "type", "width", "inputs", "output", "role"]);
    expect(rows.length - 1).toBe(mapped.netlist.gates.length);
    rows.slice(1).forEach((r, i) => {
      const g = mapped.netlist.gates[i]!;
      expect(r).toEqual([g.id, g.type, String(g.inputs.length), g.inputs.join(" "), g.output, g.role]);
    });
  });
});

describe("JSON netlist", () => {
  it("has the documented shape and counts every gate", () => {
    const a = analyse(mapped.netlist, fam);
    const doc = JSON.parse(JSON.stringify(toJsonDocument(mapped.netlist, a, mapped.warnings)));
    // the JSON netlist shape the issue specifies (common practice, no source), plus the caution the figures need
    expect(Object.keys(doc).sort()).toEqual(["caution", "gates", "inputs", "outputs", "stats", "warnings"]);
    // common practice, no source: an estimate says it is one; the text must send the reader to the data sheets
    expect(doc.caution).toMatch(/estimate/i);
    expect(doc.caution).toMatch(/data sheets/);
    expect(Object.keys(doc.stats).sort()).toEqual(["byType", "criticalPathNs", "depth", "dynamicMw", "gates", "maxLoad", "packages", "staticMw", "transistors"].sort());
    expect(doc.stats.gates).toBe(doc.gates.length);
    const types = new Set(["AND", "OR", "NAND", "NOR", "XOR", "XNOR", "NOT", "BUF"]);
    for (const g of doc.gates) expect(types.has(g.type)).toBe(true);
    // permit and lamp are the same function: the second output shares the first one's net
    const net = Object.fromEntries(doc.outputs.map((o: { name: string; net: string }) => [o.name, o.net]));
    expect(net.lamp).toBe(net.permit);
  });
});

describe("identifiers", () => {
  it("escapes Verilog keywords and keeps legal names", () => {
    // IEEE 1364: escaped identifiers start with a backslash and end with white space
    expect(verilogName("paddle_en")).toBe("paddle_en");
    expect(verilogName("wire")).toBe("\\wire ");
    expect(verilogName("nand")).toBe("\\nand ");
  });
  it("makes VHDL names legal and distinct without case", () => {
    // IEEE 1076: basic identifiers are case-insensitive, no leading, trailing or double underscore
    const nm = vhdlNamer();
    expect(nm("Gate")).toBe("Gate");
    expect(nm("gate")).toBe("\\gate\\");
    expect(nm("signal")).toBe("\\signal\\");
    expect(nm("a__b")).toBe("\\a__b\\");
    expect(nm("x_")).toBe("\\x_\\");
    expect(nm("Gate")).toBe("Gate");
    expect(unitName("chamber-interlock")).toBe("chamber_interlock");
    expect(unitName("7seg")).toBe("d_7seg");
  });
});

describe("schematic layout", () => {
  it("places every port and gate without overlap and routes every connection", async () => {
    const l = await layoutNetlist(mapped.netlist);
    const n = mapped.netlist;
    expect(l.nodes.filter((x) => x.kind === "gate").length).toBe(n.gates.length);
    expect(l.nodes.filter((x) => x.kind === "input").map((x) => x.label)).toEqual(n.inputs);
    expect(l.nodes.filter((x) => x.kind === "output").map((x) => x.label)).toEqual(n.outputs.map((o) => o.name));
    const connections = n.gates.reduce((s, g) => s + g.inputs.length, 0) + n.outputs.length;
    expect(l.edges.length).toBe(connections);
    for (const e of l.edges) expect(e.points.length).toBeGreaterThanOrEqual(2);
    for (let i = 0; i < l.nodes.length; i++)
      for (let j = i + 1; j < l.nodes.length; j++) {
        const a = l.nodes[i]!, b = l.nodes[j]!;
        const apart = a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;
        expect(apart, `${a.id} overlaps ${b.id}`).toBe(true);
      }
    // layered left to right: every gate sits right of the inputs that feed it directly
    for (const g of n.gates) {
      const node = l.nodes.find((x) => x.id === g.id)!;
      for (const i of g.inputs) {
        const src = l.nodes.find((x) => x.id === `in:${i}`);
        if (src) expect(src.x).toBeLessThan(node.x);
      }
    }
    for (const p of l.nodes.flatMap((x) => x.ports)) {
      expect(p.x).toBeGreaterThanOrEqual(0);
      expect(p.x).toBeLessThanOrEqual(l.width);
    }
  });
});

describe("layout of constants and aliases", () => {
  it("draws constant sources and routes output aliases", async () => {
    const c: CoverSet = { inputs: ["a", "b", "c"], outputs: [
      { name: "stuck", form: "sop", cubes: [] },
      { name: "wide", form: "sop", cubes: ["111"].map(cubeFromString) },
      { name: "same", form: "sop", cubes: ["1--"].map(cubeFromString) },
    ] };
    // a family whose only AND is 4 wide forces a tied input
    const r = mapCovers(c, { id: "w4", name: "Four wide", fanOut: 10, gates: [{ type: "AND", widths: [{ width: 4, perPackage: 2 }] }, { type: "OR", widths: [{ width: 2, perPackage: 4 }] }, { type: "NOT", widths: [{ width: 1, perPackage: 6 }] }] });
    expect(r.netlist.gates[0]!.inputs).toContain("1");
    const l = await layoutNetlist(r.netlist);
    expect(l.nodes.filter((x) => x.kind === "const").map((x) => x.label).sort()).toEqual(["0", "1"]);
    expect(l.edges.length).toBe(r.netlist.gates.reduce((s, g) => s + g.inputs.length, 0) + r.netlist.outputs.length);
  });
});
