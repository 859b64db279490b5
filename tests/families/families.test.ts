import { describe, expect, it } from "vitest";
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
  it("a standard TTL output cannot drive 5 V CMOS inputs whose VIH is 3.5 V", () => {
    // handbook tables: TTL VOH(min) 2.4 V < CMOS VIH(min) 0.7 · 5 V = 3.5 V
    const hc = fam("cmos-hc-5v");
    expect(hc.vihMin).toBe(3.5);
    const c = compatibility(fam("ttl-std-5v"), hc);
    expect(c.compatible).toBe(false);
    expect(c.highOk).toBe(false);
    expect(c.lowOk).toBe(true);
    expect(c.receivers.value).toBe(0);
    expect(c.messages.join(" ")).toMatch(/3\.5 V/);
  });
  it("CMOS with TTL-level inputs accepts a standard TTL output", () => {
    // handbook tables: TTL VOH 2.4 ≥ VIH 2.0 and VOL 0.4 ≤ VIL 0.8
    const c = compatibility(fam("ttl-std-5v"), fam("cmos-hct-5v"));
    expect(c.compatible).toBe(true);
    expect(c.nmh.value).toBeCloseTo(0.4, 9);
    expect(c.nml.value).toBeCloseTo(0.4, 9);
    expect(c.receivers.value).toBeGreaterThan(10);
  });
  it("a 5 V CMOS output feeds TTL inputs at its rated current", () => {
    // handbook table (from memory): 4 mA rated output, 0.26 V max; LS IIL 0.4 mA → 10 LS loads
    const c = compatibility(fam("cmos-hc-5v"), fam("ttl-ls-5v"));
    expect(c.compatible).toBe(true);
    expect(c.point).toBe("rated");
    expect(c.receivers.value).toBe(10);
  });
  it("says when figures are missing", () => {
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
    const hc = fam("cmos-hc-5v");
    const d = deriveFamily(hc);
    expect(d.fanOut.value).toBe(Math.min(d.dcFanOut.value!, d.acFanOut.value!));
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
    const keys: FigureKey[] = ["supplyV", "vohMin", "volMax", "vihMin", "vilMax", "iohMa", "iolMa", "iihMa", "iilMa", "inputCapPf", "outputOhms", "maxTransitionNs", "wiringPf", "intrinsicNs", "perLoadNs", "staticMaPerGate", "powerCapPf"];
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
    expect(validateFamily({ id: "bench-rule", name: "Bench rule", fanIn: 4, fanOut: 8 })).toEqual([]);
    const d = deriveFamily({ id: "bench-rule", name: "Bench rule", fanIn: 4, fanOut: 8 });
    expect(d.fanOut.value).toBe(8);
    expect(d.fanIn.value).toBe(4);
    expect(d.nmh.value).toBeNull();
  });
  it("explains each problem", () => {
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
    expect(m.find((c) => c.driver === "ttl-std-5v" && c.receiver === "cmos-hc-5v")?.compatible).toBe(false);
    for (const f of BUILT_IN_FAMILIES) expect(m.find((c) => c.driver === f.id && c.receiver === f.id)?.compatible).toBe(true);
  });
});
