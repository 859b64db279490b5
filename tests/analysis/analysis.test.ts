import { describe, expect, it } from "vitest";
import { analyse, CAUTION } from "../../lib/analysis/index";
import { builtInFamily, type Family } from "../../lib/families/index";
import type { Gate, Netlist } from "../../lib/map/index";

const gate = (id: string, type: Gate["type"], inputs: string[], output: string): Gate => ({ id, type, inputs, output, role: "logic" });
const hc = builtInFamily("cmos-hc-5v")!;
const ttl = builtInFamily("ttl-std-5v")!;

// Five NAND2 and one NOT: paddle enable decode drawn by hand
const paddle: Netlist = {
  inputs: ["key", "shut", "equal"],
  outputs: [{ name: "paddle_en", net: "paddle_en" }],
  complements: [],
  gates: [
    gate("g1", "NOT", ["key"], "k_n"),
    gate("g2", "NAND", ["shut", "equal"], "n1"),
    gate("g3", "NAND", ["k_n", "shut"], "n2"),
    gate("g4", "NAND", ["n1", "n2"], "n3"),
    gate("g5", "NAND", ["n3", "n3"], "n4"),
    gate("g6", "NAND", ["n4", "key"], "paddle_en"),
  ],
};

describe("counts", () => {
  const a = analyse(paddle, hc);
  it("counts gates by type and width, and packages rounded up", () => {
    expect(a.gates).toBe(6);
    expect(a.byType).toEqual({ NOT: 1, NAND: 5 });
    // five 2-input NAND at four per package → 2 packages; one inverter at six per package → 1
    expect(a.byTypeWidth.find((r) => r.type === "NAND")).toMatchObject({ width: 2, count: 5, perPackage: 4, packages: 2 });
    expect(a.packages).toBe(3);
  });
  it("CMOS NAND and NOR of n inputs use 2n transistors", () => {
    // from memory: static CMOS has one series and one parallel transistor per input
    const one = (type: Gate["type"], n: number): Netlist => ({
      inputs: ["a", "b", "c", "d"], outputs: [{ name: "y", net: "y" }], complements: [],
      gates: [gate("g1", type, ["a", "b", "c", "d"].slice(0, n), "y")],
    });
    for (const n of [2, 3, 4]) {
      expect(analyse(one("NAND", n), hc).transistors).toBe(2 * n);
      expect(analyse(one("NOR", n), hc).transistors).toBe(2 * n);
    }
    // from memory: a CMOS inverter is 2 transistors
    expect(analyse(paddle, hc).transistors).toBe(5 * 4 + 2);
  });
  it("says when a family gives no transistor counts", () => {
    const t = analyse(paddle, ttl);
    expect(t.transistors).toBeNull();
    expect(t.transistorsNote).toMatch(/no transistor counts/);
  });
  it("depth is the longest path in gate levels", () => {
    // by hand: key → g1 → g3 → g4 → g5 → g6 is five levels
    expect(a.depth).toBe(5);
    expect(a.criticalPath.gates).toEqual(["g1", "g3", "g4", "g5", "g6"]);
  });
});

describe("estimates", () => {
  it("delay follows the delay model along the path with the actual loads", () => {
    // by hand from the family's figures: each gate t0 + k · (unit loads it drives)
    const loads = { g1: 1, g3: 1, g4: 2, g5: 1, g6: 1 }; // g4's output feeds both inputs of g5; the pin is 1 unit
    const t0 = hc.intrinsicNs!, k = hc.perLoadNs!;
    const expected = Object.values(loads).reduce((s, l) => s + t0 + k * l, 0);
    const a = analyse(paddle, hc, { outputPinLoad: 1 });
    expect(a.criticalPath.delay.value).toBeCloseTo(expected, 6);
    expect(a.criticalPath.delay.caution).toBe(CAUTION);
  });
  it("static power: supply current per gate × supply voltage", () => {
    // handbook arithmetic: P = I · V; the figures are the family's inputs
    const a = analyse(paddle, ttl);
    expect(a.staticPower.value).toBeCloseTo(6 * ttl.staticMaPerGate! * 5, 6);
    expect(a.staticPower.value).toBeGreaterThan(10); // a bipolar family draws current while holding a level
    // JEDEC JESD7A: 20 µA per small-scale package over temperature, four gates → 0.005 mA × 4.5 V × 6 gates = 0.135 mW,
    // hundreds of times below the bipolar figure
    expect(analyse(paddle, hc).staticPower.value!).toBeCloseTo(0.135, 6);
    expect(analyse(paddle, hc).staticPower.value! * 100).toBeLessThan(a.staticPower.value!);
  });
  it("TTL-level CMOS adds its extra supply current for inputs held at a TTL high", () => {
    // JEDEC JESD7A (the family's source note): 0.45 mA extra per input held at VCC − 2.1 V over −40 to 85 °C, at
    // VCC = 4.5 V. Worked by hand for the paddle netlist: gate inputs fed straight from the design's inputs are g1 key,
    // g2 shut and equal, g3 shut, g6 key = 5 pins; inner nets swing rail to rail. With half of them high on average:
    //   0.005 mA × 4.5 V × 6 gates + 0.45 mA × 4.5 V × 5 pins × 0.5 = 0.135 + 5.0625 = 5.1975 mW
    const hct = builtInFamily("cmos-hct-5v")!;
    const a = analyse(paddle, hct);
    expect(a.staticPower.value).toBeCloseTo(5.198, 6);
    expect(a.staticPower.note).toMatch(/50 % of the 5 gate inputs/);
    expect(a.staticPower.formula).toMatch(/0\.45 mA/);
    // with rail-to-rail inputs only the quiescent part remains: 0.005 × 4.5 × 6 = 0.135 mW
    expect(analyse(paddle, hct, { ttlHighShare: 0 }).staticPower.value).toBeCloseTo(0.135, 6);
    // worked by hand: the same netlist on plain high-speed CMOS carries no such term, 0.005 × 4.5 × 6 = 0.135 mW
    expect(analyse(paddle, hc).staticPower.value).toBeCloseTo(0.135, 6);
  });
  it("dynamic power: C · V² · f · activity", () => {
    // textbook switching power; C summed by hand: every gate output's loads × C_in + wiring + internal
    const loads = [1, 1, 1, 2, 1, 1]; // outputs of g1..g6 (n3 feeds g5 twice; the pin is 1)
    const c = loads.reduce((s, l) => s + l * hc.inputCapPf! + hc.wiringPf! + hc.powerCapPf!, 0);
    // the family's figures are stated at VCC = 4.5 V (JESD7A column), so V² = 4.5²
    expect(hc.supplyV).toBe(4.5);
    const mW = (c * 1e-12 * 4.5 * 4.5 * 20e6 * 0.5) * 1000;
    const a = analyse(paddle, hc, { clockMHz: 20, activity: 0.5 });
    expect(a.dynamicPower.value).toBeCloseTo(mW, 3);
    expect(a.dynamicPower.caution).toMatch(/data sheets/);
  });
  it("a family with only fan-in and fan-out omits what it cannot estimate and says so", () => {
    const bare: Family = { id: "bare", name: "Bare rule", fanIn: 2, fanOut: 3 };
    const a = analyse(paddle, bare);
    expect(a.criticalPath.delay.value).toBeNull();
    expect(a.staticPower.value).toBeNull();
    expect(a.dynamicPower.value).toBeNull();
    expect(a.packages).toBeNull();
    expect(a.warnings.join(" ")).toMatch(/delay not estimated/);
    expect(a.depth).toBe(5);
  });
});

describe("loads", () => {
  it("reports each net's load against its limit", () => {
    const many: Netlist = {
      inputs: ["estop"],
      outputs: Array.from({ length: 12 }, (_, i) => ({ name: `lamp${i}`, net: `l${i}` })),
      complements: [],
      gates: Array.from({ length: 12 }, (_, i) => gate(`g${i + 1}`, "BUF", ["estop"], `l${i}`)),
    };
    const a = analyse(many, { ...hc, fanOut: 10 });
    const estop = a.loads.find((l) => l.net === "estop")!;
    expect(estop).toMatchObject({ load: 12, limit: 10, status: "over", driver: "input" });
    expect(a.maxLoad).toBe(12);
    expect(a.warnings.join(" ")).toMatch(/estop carries 12 unit loads/);
    const b = analyse(many, { ...hc, fanOut: 12 });
    expect(b.loads.find((l) => l.net === "estop")!.status).toBe("at-limit");
  });
});
