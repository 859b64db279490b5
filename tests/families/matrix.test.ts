import { describe, expect, it } from "vitest";
import {
  BUILT_IN_FAMILIES,
  builtInFamily,
  compatibility,
  compatibilityMatrix,
  compatibilityPair,
  deriveFamily,
  FIGURES,
  SMALL_MARGIN_V,
  validateFamily,
  type Family,
} from "../../lib/families/index";

const fam = (id: string) => {
  const f = builtInFamily(id);
  if (!f) throw new Error(`no family ${id}`);
  return f;
};
const pair = (d: string, r: string) => compatibilityPair(fam(d), fam(r));

describe("compatibility matrix against handbook figures", () => {
  it("standard TTL into itself: margins 0.4 V and 0.4 V, ten inputs per output in each state", () => {
    // standard TTL as every digital-design textbook tabulates it: VOH 2.4, VIH 2.0, VIL 0.8, VOL 0.4 V;
    // IOL 16 mA / IIL 1.6 mA = 10, IOH 0.4 mA / IIH 40 µA = 10
    const p = pair("ttl-std-5v", "ttl-std-5v");
    expect(p.nmhV).toBeCloseTo(0.4, 9);
    expect(p.nmlV).toBeCloseTo(0.4, 9);
    expect(p.fanOutHigh).toBe(10);
    expect(p.fanOutLow).toBe(10);
    expect(p.verdict).toBe("compatible");
    expect(p.formulas.fanOutLow).toBe("floor(IOL / |IIL|) = floor(16 mA / 1.6 mA) = 10");
    expect(p.formulas.fanOutHigh).toBe("floor(|IOH| / IIH) = floor(0.4 mA / 0.04 mA) = 10");
    expect(p.formulas.nmh).toBe("NMH = VOH(min) − VIH(min) = 2.4 − 2 = 0.4 V");
  });

  it("a TTL output into CMOS-threshold inputs is not compatible", () => {
    // textbook TTL VOH(min) 2.4 V; JEDEC JESD7A, VCC = 4.5 V: VIH(min) 3.15 V → NMH = 2.4 − 3.15 = −0.75 V
    const p = pair("ttl-std-5v", "cmos-hc-5v");
    expect(p.verdict).toBe("not-compatible");
    expect(p.nmhV).toBeCloseTo(-0.75, 9);
    // the low level still meets: VIL(max) 1.35 − VOL(max) 0.4 = 0.95 V (JESD7A; textbook TTL)
    expect(p.nmlV).toBeCloseTo(0.95, 9);
    expect(p.messages.join(" ")).toMatch(/pull-up resistor .* TTL-level inputs/);
    // the same output into CMOS with TTL-level inputs (JESD7A: VIH 2.0, VIL 0.8 V) meets both levels
    expect(pair("ttl-std-5v", "cmos-hct-5v").verdict).toBe("compatible");
    // and low-power Schottky's higher VOH(min) 2.7 V (handbook table) still misses 3.15 V
    expect(pair("ttl-ls-5v", "cmos-hc-5v").verdict).toBe("not-compatible");
  });

  it("high-speed CMOS into TTL inputs: the rated 4 mA point gives two standard or ten low-power Schottky inputs", () => {
    // JEDEC JESD7A, VCC = 4.5 V, −40 to 85 °C: VOH 3.84 V at −4 mA, VOL 0.33 V at 4 mA;
    // textbook standard TTL: VIH 2.0, VIL 0.8 V, IIH 40 µA, IIL 1.6 mA
    const p = pair("cmos-hc-5v", "ttl-std-5v");
    expect(p.point).toBe("rated");
    expect(p.nmhV).toBeCloseTo(3.84 - 2.0, 9);
    expect(p.nmlV).toBeCloseTo(0.8 - 0.33, 9);
    expect(p.fanOutLow).toBe(2); // floor(4 / 1.6)
    expect(p.fanOutHigh).toBe(100); // floor(4 / 0.04)
    expect(p.verdict).toBe("compatible");
    // low-power Schottky handbook table: IIL 0.4 mA → floor(4 / 0.4) = 10
    expect(pair("cmos-hc-5v", "ttl-ls-5v").fanOutLow).toBe(10);
  });

  it("low-power Schottky drives five standard TTL inputs low", () => {
    // handbook tables: LS IOL 8 mA / standard IIL 1.6 mA = 5; LS IOH 0.4 mA / standard IIH 40 µA = 10
    const p = pair("ttl-ls-5v", "ttl-std-5v");
    expect(p.fanOutLow).toBe(5);
    expect(p.fanOutHigh).toBe(10);
    // NML = 0.8 − 0.5 = 0.3 V, exactly the small-margin line, which still counts as compatible
    expect(p.nmlV).toBeCloseTo(0.3, 9);
    expect(SMALL_MARGIN_V).toBe(0.3);
    expect(p.verdict).toBe("compatible");
  });

  it("calls a thin margin small", () => {
    // worked by hand: textbook TTL VOH(min) 2.4 V into inputs measured to need 2.2 V → NMH = 0.2 V < 0.3 V
    const measured: Family = { ...fam("cmos-hct-5v"), id: "bench-inputs", name: "Bench inputs", vihMin: 2.2 };
    const c = compatibility(fam("ttl-std-5v"), measured);
    expect(c.nmh.value).toBeCloseTo(0.2, 9);
    expect(c.verdict).toBe("small-margin");
    expect(c.messages.join(" ")).toMatch(/0\.2 V is below 0\.3 V/);
  });

  it("refuses a 5 V CMOS swing into 3.3 V inputs that do not tolerate it", () => {
    // JESD7A: the output swings to VCC = 4.5 V; 3.3 V CMOS inputs without 5 V tolerance: absolute maximum VDD + 0.5 = 3.8 V (from memory)
    const p = pair("cmos-hc-5v", "lvcmos-3v3");
    expect(p.nmhV).toBeGreaterThan(0); // the levels alone would pass
    expect(p.verdict).toBe("not-compatible");
    expect(p.messages.join(" ")).toMatch(/4\.5 V supply, above the 3\.8 V/);
    // the other way round, a 3.3 V output misses the 3.15 V threshold: 2.8 − 3.15 < 0 (JESD8-C, JESD7A)
    expect(pair("lvcmos-3v3", "cmos-hc-5v").verdict).toBe("not-compatible");
    expect(pair("lvcmos-3v3", "cmos-hct-5v").verdict).toBe("compatible");
  });

  it("says when it cannot tell", () => {
    // common practice, no source: a family with only a fan-in and a fan-out gives no levels to compare
    const bare: Family = { id: "bare", name: "Bare", fanIn: 4, fanOut: 8 };
    const p = compatibilityPair(bare, fam("ttl-std-5v"));
    expect(p.verdict).toBe("unknown");
    expect(p.nmhV).toBeNull();
    expect(p.messages.join(" ")).toMatch(/not checked/);
  });

  it("a driver too weak for even one input is not compatible", () => {
    // worked by hand: floor(IOL 1 mA / |IIL| 1.6 mA) = 0 standard TTL inputs (textbook IIL)
    const weak: Family = { ...fam("cmos-hct-5v"), id: "weak", name: "Weak", iolMa: 1, ratedDrive: undefined };
    const p = compatibilityPair(weak, fam("ttl-std-5v"));
    expect(p.fanOutLow).toBe(0);
    expect(p.verdict).toBe("not-compatible");
    expect(p.messages.join(" ")).toMatch(/cannot feed even one .* input \(low limit\)/);
  });

  it("covers every ordered pair, each family with itself", () => {
    const own: Family = { ...fam("ttl-ls-5v"), id: "ferrow-ls", name: "Ferrow bench LS", builtIn: false };
    const all = [...BUILT_IN_FAMILIES, own];
    const m = compatibilityMatrix(all);
    expect(m.length).toBe(all.length ** 2);
    expect(new Set(m.map((p) => `${p.driver}>${p.receiver}`)).size).toBe(all.length ** 2);
    // a family always meets its own levels when validateFamily accepts it (VOH > VIH, VOL < VIL)
    for (const f of all) expect(m.find((p) => p.driver === f.id && p.receiver === f.id)!.verdict).not.toBe("not-compatible");
  });
});

describe("derived figures of a family", () => {
  it("follow each figure with its formula", () => {
    // worked by hand: IOL 24 mA / |IIL| 1.6 mA = 15; |IOH| 2.6 mA / IIH 0.04 mA = 65; NMH 2.9 − 2.0 = 0.9 V; NML 0.8 − 0.5 = 0.3 V
    const f: Family = { id: "x", name: "X", iolMa: 24, iilMa: -1.6, iohMa: -2.6, iihMa: 0.04, vohMin: 2.9, vihMin: 2, vilMax: 0.8, volMax: 0.5 };
    const d = deriveFamily(f);
    expect(d.dcFanOutLow.value).toBe(15);
    expect(d.dcFanOutHigh.value).toBe(65);
    expect(d.dcFanOut.value).toBe(15);
    expect(d.nmh.value).toBeCloseTo(0.9, 9);
    expect(d.nml.value).toBeCloseTo(0.3, 9);
    expect(d.dcFanOutHigh.formula).toBe("floor(|IOH| / IIH) = floor(2.6 mA / 0.04 mA) = 65");
    // a change of one figure moves only what depends on it: IOL 8 mA → floor(8 / 1.6) = 5
    const d2 = deriveFamily({ ...f, iolMa: 8 });
    expect(d2.dcFanOutLow.value).toBe(5);
    expect(d2.dcFanOutHigh.value).toBe(65);
    expect(d2.fanOut.value).toBe(5);
  });
  it("AC fan-out from the edge-rate limit", () => {
    // worked by hand: C_max = 100 ns / (2.2 · 50 Ω) = 909.09 pF; n = floor((909.09 − 9) / 10) = 90
    const d = deriveFamily({ id: "x", name: "X", outputOhms: 50, maxTransitionNs: 100, inputCapPf: 10, wiringPf: 9 });
    expect(d.acFanOut.value).toBe(90);
    expect(d.acFanOut.formula).toContain("2.2 · 50 Ω");
  });
});

describe("validation names the figure and its range", () => {
  it("says which figure, what range and what was given", () => {
    // common practice, no source: a supply of 50 V is a unit slip for any logic family here
    const p = validateFamily({ id: "x", name: "X", supplyV: 50, iilMa: 2000, inputCapPf: 0 });
    const by = Object.fromEntries(p.map((x) => [x.field, x.message]));
    expect(by.supplyV).toBe("VCC (supply voltage) must be above 0 and at most 30 V; got 50");
    expect(by.iilMa).toMatch(/^IIL \(input current at a low level\) must be from 0\.000001 to 1000 mA in magnitude/);
    expect(by.inputCapPf).toMatch(/^C_in .* above 0 and at most 10 000 pF; got 0$/);
    expect(validateFamily({ id: "x", name: "X", vohMin: "high" })[0]!.message).toBe(
      'VOH(min) (lowest guaranteed output high level) in V must be a number, not "high"',
    );
  });
  it("every figure of the data model has a spec, and every built-in figure lies in its range", () => {
    const keys = FIGURES.map((f) => f.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const f of BUILT_IN_FAMILIES) expect(validateFamily(f), f.id).toEqual([]);
  });
});
