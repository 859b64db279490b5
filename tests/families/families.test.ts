import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  BUILT_IN_FAMILIES,
  builtInFamily,
  compatibility,
  deriveFamily,
  acFanOutFigure,
  riseTimeNs,
  validateFamily,
  familyFanOut,
  type Family,
  type FigureKey,
} from "../../lib/families/index";

const fam = (id: string) => {
  const f = builtInFamily(id);
  if (!f) throw new Error(`no family ${id}`);
  return f;
};

describe("standard TTL figures", () => {
  const d = deriveFamily(fam("ttl-std-5v"));
  it("has a DC fan-out of 10 in both states", () => {
    // handbook table: standard TTL IOL 16 mA / IIL 1.6 mA = 10, IOH 0.4 mA / IIH 40 µA = 10
    expect(d.dcFanOutLow.value).toBe(10);
    expect(d.dcFanOutHigh.value).toBe(10);
    expect(d.dcFanOut.value).toBe(10);
    expect(d.dcFanOut.formula).toContain("min(10, 10)");
  });
  it("has noise margins of 0.4 V high and low", () => {
    // handbook table: VOH 2.4 − VIH 2.0 = 0.4 V; VIL 0.8 − VOL 0.4 = 0.4 V
    expect(d.nmh.value).toBeCloseTo(0.4, 9);
    expect(d.nml.value).toBeCloseTo(0.4, 9);
    expect(d.nmh.formula).toContain("VOH(min) − VIH(min)");
  });
  it("says the AC fan-out is not estimated without a transition limit", () => {
    // common practice, no source: TTL inputs carry no edge-rate limit in our data, so DC governs
    expect(d.acFanOut.value).toBeNull();
    expect(d.acFanOut.formula).toMatch(/not estimated/);
    expect(d.fanOut.value).toBe(10);
  });
});

describe("low-power Schottky TTL", () => {
  it("drives 20 of its own inputs", () => {
    // handbook table: IOL 8 mA / IIL 0.4 mA = 20; IOH 0.4 mA / IIH 20 µA = 20
    expect(deriveFamily(fam("ttl-ls-5v")).dcFanOut.value).toBe(20);
    expect(compatibility(fam("ttl-ls-5v"), fam("ttl-ls-5v")).receivers.value).toBe(20);
  });
  it("drives only 5 standard TTL inputs", () => {
    // handbook tables: LS IOL 8 mA / standard IIL 1.6 mA = 5
    expect(compatibility(fam("ttl-ls-5v"), fam("ttl-std-5v")).receivers.value).toBe(5);
  });
});

describe("driver to receiver compatibility", () => {
  it("a standard TTL output cannot drive CMOS inputs with CMOS thresholds", () => {
    // JEDEC JESD7A (VCC = 4.5 V column): VIH(min) 3.15 V = 0.7 · 4.5 V; standard TTL handbook table: VOH(min) 2.4 V < 3.15 V
    const hc = fam("cmos-hc-5v");
    expect(hc.vihMin).toBe(3.15);
    const c = compatibility(fam("ttl-std-5v"), hc);
    expect(c.compatible).toBe(false);
    expect(c.highOk).toBe(false);
    expect(c.lowOk).toBe(true);
    expect(c.receivers.value).toBe(0);
    expect(c.verdict).toBe("not-compatible");
    expect(c.nmh.value).toBeCloseTo(2.4 - 3.15, 9);
    expect(c.messages.join(" ")).toMatch(/3\.15 V/);
    expect(c.messages.join(" ")).toMatch(/pull-up .*TTL-level inputs/);
  });
  it("CMOS with TTL-level inputs accepts a standard TTL output", () => {
    // handbook tables: TTL VOH 2.4 ≥ VIH 2.0 and VOL 0.4 ≤ VIL 0.8
    const c = compatibility(fam("ttl-std-5v"), fam("cmos-hct-5v"));
    expect(c.compatible).toBe(true);
    expect(c.nmh.value).toBeCloseTo(0.4, 9);
    expect(c.nml.value).toBeCloseTo(0.4, 9);
    // worked by hand from the handbook/from-memory figures in builtin.ts (TTL driver, TTL-level CMOS receiver):
    //   DC low  floor(IOL 16 mA / |IIL| 0.001 mA) = 16000
    //   DC high floor(|IOH| 0.4 mA / IIH 0.001 mA) = 400
    //   AC      C_max = 500 ns / (2.2 · 130 Ω) = 500000 pF·Ω / 286 Ω = 1748.25 pF (from memory: t ≈ 2.2·R·C);
    //           n = floor((1748.25 − 5 pF wiring) / 10 pF) = floor(174.3) = 174
    //   receivers = min(16000, 400, 174) = 174, the edge-rate limit governs
    expect(c.receivers.value).toBe(174);
  });
  it("a 5 V CMOS output feeds TTL inputs at its rated current", () => {
    // JEDEC JESD7A (VCC = 4.5 V, −40 to 85 °C): 4 mA rated output, VOL 0.33 V, VOH 3.84 V;
    // low-power Schottky handbook table: IIL 0.4 mA, IIH 20 µA → floor(4 / 0.4) = 10, floor(4 / 0.02) = 200
    const c = compatibility(fam("cmos-hc-5v"), fam("ttl-ls-5v"));
    expect(c.compatible).toBe(true);
    expect(c.point).toBe("rated");
    expect(c.fanOutLow.value).toBe(10);
    expect(c.fanOutHigh.value).toBe(200);
    expect(c.receivers.value).toBe(10);
    // NMH = 3.84 − 2.0 = 1.84 V; NML = 0.8 − 0.33 = 0.47 V
    expect(c.nmh.value).toBeCloseTo(1.84, 9);
    expect(c.nml.value).toBeCloseTo(0.47, 9);
  });
  it("says when figures are missing", () => {
    // common practice, no source: a family with only fan-in and fan-out gives no levels, so nothing can be compared
    const user: Family = { id: "u", name: "User", fanIn: 4, fanOut: 8 };
    const c = compatibility(user, fam("cmos-hc-5v"));
    expect(c.compatible).toBeNull();
    expect(c.messages.join(" ")).toMatch(/not checked/);
  });
});

describe("transition time", () => {
  it("the 10–90 % rise time of an RC stage is about 2.2 · R · C", () => {
    // textbook RC step response: v = 1 − e^(−t/RC); t90 − t10 = RC · ln 9 ≈ 2.197 RC
    const rc = 1000 * 10e-12; // 1 kΩ, 10 pF
    const exact = rc * Math.log(9) * 1e9; // ns
    expect(riseTimeNs(1000, 10)).toBeCloseTo(22, 9);
    expect(Math.abs(riseTimeNs(1000, 10) - exact) / exact).toBeLessThan(0.002);
  });
  it("AC fan-out is the largest n with 2.2 · R · (n · C_in + C_wire) within the limit", () => {
    // brute force computed here
    for (const [r, t, cin, cw] of [[65, 500, 10, 5], [25, 33, 5, 5], [130, 100, 3, 0], [1000, 50, 7, 2]] as const) {
      let n = 0;
      while (riseTimeNs(r, (n + 1) * cin + cw) <= t + 1e-9) n++; // boundary counts as within the limit
      expect(acFanOutFigure(r, t, cin, cw).value).toBe(n);
    }
  });
  it("the family fan-out is the lower of DC and AC", () => {
    // worked by hand from the high-speed CMOS figures (JEDEC JESD7A, VCC = 4.5 V column, −40 to 85 °C):
    //   DC low  floor(IOL 0.02 mA / |IIL| 0.001 mA) = 20;  DC high floor(|IOH| 0.02 mA / IIH 0.001 mA) = 20
    //   R_out = (4.5 − 3.84) V / 4 mA = 165 Ω (the standard's 4 mA point, high side)
    //   AC      C_max = 500 ns / (2.2 · 165 Ω) = 500000 / 363 = 1377.4 pF; n = floor((1377.4 − 5) / 10) = floor(137.24) = 137
    //   fan-out = min(20, 137) = 20
    const hc = fam("cmos-hc-5v");
    const d = deriveFamily(hc);
    expect(hc.outputOhms).toBeCloseTo((4.5 - 3.84) / 4e-3, 6);
    expect(d.dcFanOut.value).toBe(20);
    expect(d.acFanOut.value).toBe(137);
    expect(d.fanOut.value).toBe(20);
    // common practice, no source: a fan-out the user sets overrides the derived one
    expect(familyFanOut({ ...hc, fanOut: 7 })).toBe(7);
  });
});

describe("built-in families", () => {
  it("include the product's generic families", () => {
    const names = BUILT_IN_FAMILIES.map((f) => f.name);
    for (const n of [
      "Bipolar TTL, standard, 5 V",
      "Low-power Schottky TTL, 5 V",
      "High-speed CMOS, 5 V",
      "High-speed CMOS with TTL-level inputs, 5 V",
      "Low-voltage CMOS, 3.3 V",
    ])
      expect(names).toContain(n);
  });
  it("give a source for every figure and no part numbers", () => {
    const keys: FigureKey[] = ["supplyV", "vohMin", "volMax", "vihMin", "vilMax", "iohMa", "iolMa", "iihMa", "iilMa", "inputCapPf", "outputOhms", "maxTransitionNs", "wiringPf", "intrinsicNs", "perLoadNs", "staticMaPerGate", "powerCapPf", "ttlHighInputMa"];
    for (const f of BUILT_IN_FAMILIES) {
      for (const k of keys) if (f[k] !== undefined) expect(f.sources?.[k], `${f.id}.${k}`).toBeTruthy();
      expect(validateFamily(f), f.id).toEqual([]);
      // common practice, no source: part numbers look like digit runs of 2+ before letters, e.g. "74…"
      expect(JSON.stringify(f)).not.toMatch(/\b(54|74)[A-Z]{0,3}\d{2,}/);
    }
  });
  it("3.3 V levels follow JEDEC JESD8-C", () => {
    // JEDEC JESD8-C (from memory): VIH 2.0 V, VIL 0.8 V; LVTTL VOH 2.4 V / VOL 0.4 V at 2 mA
    const lv = fam("lvcmos-3v3");
    expect(lv.vihMin).toBe(2.0);
    expect(lv.vilMax).toBe(0.8);
    expect(lv.ratedDrive).toMatchObject({ vohMin: 2.4, volMax: 0.4 });
    expect(lv.sources?.vihMin).toMatch(/JESD8/);
  });
});

describe("validateFamily", () => {
  it("accepts a family with only a fan-in and a fan-out", () => {
    // the product's own rule, no outside source: a user family may give only a fan-in and a fan-out; the rest is then not estimated
    expect(validateFamily({ id: "bench-rule", name: "Bench rule", fanIn: 4, fanOut: 8 })).toEqual([]);
    const d = deriveFamily({ id: "bench-rule", name: "Bench rule", fanIn: 4, fanOut: 8 });
    expect(d.fanOut.value).toBe(8);
    expect(d.fanIn.value).toBe(4);
    expect(d.nmh.value).toBeNull();
  });
  it("explains each problem", () => {
    // handbook definitions (from memory): VOH(min) > VIH(min) and VOL(max) < VIL(max) for a family to drive itself;
    // a supply voltage is positive; fan-in and fan-out below 2 make no gate tree or buffer possible
    const p = validateFamily({ id: "Bad Id", name: "", supplyV: -5, vohMin: 1.5, vihMin: 2, volMax: 0.9, vilMax: 0.8, fanIn: 1, fanOut: 1, iolMa: 0 });
    const fields = p.map((x) => x.field);
    for (const f of ["id", "name", "supplyV", "vohMin", "volMax", "fanIn", "fanOut", "iolMa"]) expect(fields).toContain(f);
    expect(p.find((x) => x.field === "vohMin")!.message).toMatch(/VOH\(min\) must be above VIH\(min\)/);
  });
});

describe("compatibility matrix", () => {
  it("covers every pair and matches the handbook cases", async () => {
    const { compatibilityMatrix } = await import("../../lib/families/index");
    const m = compatibilityMatrix(BUILT_IN_FAMILIES);
    expect(m.length).toBe(BUILT_IN_FAMILIES.length ** 2);
    // handbook tables: TTL high level 2.4 V fails a 3.5 V CMOS threshold; each family drives itself
    expect(m.find((c) => c.driver === "ttl-std-5v" && c.receiver === "cmos-hc-5v")?.verdict).toBe("not-compatible");
    for (const f of BUILT_IN_FAMILIES) expect(m.find((c) => c.driver === f.id && c.receiver === f.id)?.verdict).toBe("compatible");
  });
});

describe("validateFamily on any JSON", () => {
  it("never throws and always answers with a list of problems", () => {
    // common practice, no source: a checker fed arbitrary parsed JSON must not crash; fast-check generates the JSON
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), fc.record({ id: fc.constant("x"), name: fc.constant("X"), gates: fc.jsonValue(), transistors: fc.jsonValue(), ratedDrive: fc.jsonValue(), sources: fc.jsonValue() })), (v) => {
        const p = validateFamily(v);
        expect(Array.isArray(p)).toBe(true);
        for (const x of p) expect(typeof x.message === "string" && x.message.length > 0).toBe(true);
      }),
      { numRuns: 300 },
    );
    for (const v of [null, 3, "ttl", [], [1, 2]]) expect(validateFamily(v).length).toBeGreaterThan(0);
  });
  const base = { id: "sluice-rule", name: "Sluice rule", fanOut: 4 };
  const fields = (v: unknown) => validateFamily(v).map((p) => p.field);
  it("names null gates and widths instead of throwing", () => {
    // the reviewer's cases: gates: [null] and widths: [null] used to throw a TypeError
    expect(fields({ ...base, gates: [null] })).toEqual(["gates[0]"]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [null] }] })).toEqual(["gates[0].widths[0]"]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: "2" }] })).toEqual(["gates[0].widths"]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [{ width: 2, perPackage: 4 }] }, { type: "NAND", widths: [{ width: 3, perPackage: 3 }] }] })).toEqual(["gates[1].type"]);
  });
  it("caps widths at 64 inputs and perPackage at 64 gates", () => {
    // common practice, no source: the limit the design settings already put on fan-in (64); no package holds more than 64 gates
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [{ width: 64, perPackage: 1 }] }] })).toEqual([]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [{ width: 65, perPackage: 1 }] }] })).toEqual(["gates[0].widths[0].width"]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [{ width: 1e9, perPackage: 1 }] }] })).toEqual(["gates[0].widths[0].width"]);
    expect(fields({ ...base, gates: [{ type: "NAND", widths: [{ width: 2, perPackage: 1e6 }] }] })).toEqual(["gates[0].widths[0].perPackage"]);
    expect(fields({ ...base, fanIn: 1e9 })).toEqual(["fanIn"]);
    expect(validateFamily({ ...base, gates: [{ type: "NAND", widths: [{ width: 1e9, perPackage: 1 }] }] })[0]!.message).toMatch(/2 to 64/);
  });
  it("checks transistor counts", () => {
    // common practice, no source: a transistor count is a finite number of at least 0
    expect(fields({ ...base, transistors: { NAND: { base: 0, perInput: 2 } } })).toEqual([]);
    expect(fields({ ...base, transistors: 5 })).toEqual(["transistors"]);
    expect(fields({ ...base, transistors: { NAND: { base: "two", perInput: -1 } } })).toEqual(["transistors.NAND.base", "transistors.NAND.perInput"]);
    expect(fields({ ...base, transistors: { NAND: { base: Number.NaN, perInput: 2 } } })).toEqual(["transistors.NAND.base"]);
    expect(fields({ ...base, transistors: { VALVE: { base: 1, perInput: 1 } } })).toEqual(["transistors.VALVE"]);
    expect(fields({ ...base, transistors: { NOR: null } })).toEqual(["transistors.NOR"]);
  });
  it("reports a derived fan-out below 2 unless the family sets its own", () => {
    // worked by hand: floor(IOL 1 mA / |IIL| 1.6 mA) = floor(0.625) = 0 (standard TTL input current, handbook table)
    const weak = { id: "weak-drive", name: "Weak drive", iolMa: 1, iilMa: -1.6, iohMa: -0.4, iihMa: 0.04 };
    const p = validateFamily(weak);
    expect(p.map((x) => x.field)).toEqual(["fanOut"]);
    expect(p[0]!.message).toMatch(/derived fan-out of 0/);
    expect(p[0]!.message).toContain("floor(IOL / |IIL|) = floor(1 mA / 1.6 mA) = 0");
    expect(p[0]!.message).toMatch(/set fanOut in the family, or fix IOL\/IIL\/IOH\/IIH/);
    expect(validateFamily({ ...weak, fanOut: 3 })).toEqual([]);
    // worked by hand: C_max = 10 ns / (2.2 · 1000 Ω) = 4.545 pF < one 5 pF input, so the AC fan-out is 0
    const slow = { id: "slow-edge", name: "Slow edge", outputOhms: 1000, maxTransitionNs: 10, inputCapPf: 5 };
    expect(validateFamily(slow)[0]!.message).toMatch(/AC .*= 0/);
  });
});
