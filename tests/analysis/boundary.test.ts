import { describe, expect, it } from "vitest";
import { analyse, CAUTION } from "../../lib/analysis/index";
import { builtInFamily } from "../../lib/families/index";
import { compileNow } from "../../lib/pipeline/index";
import type { Gate, Netlist } from "../../lib/map/index";

const fam = (id: string) => builtInFamily(id)!;
const gate = (id: string, type: Gate["type"], inputs: string[], output: string): Gate => ({ id, type, inputs, output, role: "logic" });

// estop feeds six buffers: one input net carrying six gate inputs
const fanned: Netlist = {
  inputs: ["estop", "key"],
  outputs: Array.from({ length: 6 }, (_, i) => ({ name: `lamp${i}`, net: `l${i}` })),
  complements: [],
  gates: Array.from({ length: 6 }, (_, i) => gate(`g${i + 1}`, i === 0 ? "AND" : "BUF", i === 0 ? ["estop", "key"] : ["estop"], `l${i}`)),
};

describe("the design's boundaries with other families", () => {
  it("inputs driven by standard TTL into CMOS thresholds: not compatible, said with the figures", () => {
    // textbook standard TTL VOH(min) 2.4 V; JEDEC JESD7A VIH(min) 3.15 V at VCC = 4.5 V
    const a = analyse(fanned, fam("cmos-hc-5v"), { boundary: { inputsDrivenBy: fam("ttl-std-5v") } });
    expect(a.boundaries).toHaveLength(1);
    const b = a.boundaries[0]!;
    expect(b).toMatchObject({ side: "inputs", verdict: "not-compatible", driver: { id: "ttl-std-5v" }, receiver: { id: "cmos-hc-5v" }, caution: CAUTION });
    expect(b.nmhV).toBeCloseTo(-0.75, 9);
    expect(a.warnings.join(" ")).toMatch(/inputs driven by Bipolar TTL, standard, 5 V: not compatible — .*2\.4 V, below the 3\.15 V/);
  });

  it("an input net loading its driver past its fan-out is named", () => {
    // handbook tables: low-power Schottky IOL 8 mA / standard TTL IIL 1.6 mA = 5 inputs; estop feeds 6
    const a = analyse(fanned, fam("ttl-std-5v"), { boundary: { inputsDrivenBy: fam("ttl-ls-5v") } });
    const b = a.boundaries[0]!;
    expect(b.verdict).toBe("compatible");
    expect(b).toMatchObject({ load: 6, at: "input estop", fanOutLow: 5, perOutput: 5 });
    expect(a.warnings.join(" ")).toMatch(/input estop feeds 6 gate inputs, but one Low-power Schottky TTL, 5 V output may feed only 5/);
    // key feeds one input: the same driver is fine for a netlist whose heaviest input net carries five
    const light: Netlist = { ...fanned, gates: fanned.gates.slice(0, 5) , outputs: fanned.outputs.slice(0, 5) };
    expect(analyse(light, fam("ttl-std-5v"), { boundary: { inputsDrivenBy: fam("ttl-ls-5v") } }).warnings.join(" ")).not.toMatch(/feeds .* gate inputs/);
  });

  it("outputs into TTL inputs: the pin load counts receiver inputs against the driver's rated current", () => {
    // JEDEC JESD7A 4 mA rated point: floor(4 mA / 1.6 mA) = 2 standard TTL inputs (textbook IIL); three on each output is one too many
    const a = analyse(fanned, fam("cmos-hc-5v"), { outputPinLoad: 3, boundary: { outputsDrive: fam("ttl-std-5v") } });
    const b = a.boundaries[0]!;
    expect(b).toMatchObject({ side: "outputs", verdict: "compatible", perOutput: 2, load: 3 });
    expect(a.warnings.join(" ")).toMatch(/outputs driving Bipolar TTL, standard, 5 V: each output drives 3 .* but may feed only 2; add an output buffer/);
    const ok = analyse(fanned, fam("cmos-hc-5v"), { outputPinLoad: 2, boundary: { outputsDrive: fam("ttl-std-5v") } });
    expect(ok.warnings.join(" ")).not.toMatch(/outputs driving/);
  });

  it("no boundary named, nothing checked", () => {
    expect(analyse(fanned, fam("cmos-hc-5v")).boundaries).toEqual([]);
  });

  it("the pipeline resolves the settings' families, and says so when one is unknown", () => {
    const src = "inputs a, b\noutputs f\nf = a * b\n";
    const family = fam("cmos-hct-5v");
    const r = compileNow({ source: src, family, settings: { inputsDrivenBy: "ttl-ls-5v", outputsDrive: "lvcmos-3v3" } }).result!;
    // HCT inputs read TTL levels (JESD7A); its 4.5 V swing exceeds the 3.8 V a 3.3 V CMOS input tolerates (from memory)
    expect(r.analysis.boundaries.map((b) => [b.side, b.verdict])).toEqual([["inputs", "compatible"], ["outputs", "not-compatible"]]);
    const u = compileNow({ source: src, family, settings: { inputsDrivenBy: "valve-logic" } }).result!;
    expect(u.analysis.boundaries).toEqual([]);
    expect(u.warnings.join(" ")).toMatch(/"valve-logic", is unknown: that boundary is not checked/);
    // a workspace's own family is found among the families passed in
    const own = { ...fam("ttl-ls-5v"), id: "ferrow-latch", name: "Ferrow latch board" };
    const o = compileNow({ source: src, family, settings: { inputsDrivenBy: "ferrow-latch" }, families: [own] }).result!;
    expect(o.analysis.boundaries[0]).toMatchObject({ side: "inputs", driver: { id: "ferrow-latch", name: "Ferrow latch board" } });
  });
});
