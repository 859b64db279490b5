// The mapper prices the realisations it can build from the family's gates and
// keeps the cheapest by gates, then packages. Each expected count is the
// circuit a designer would draw, with its source named beside the check.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { mapCovers, TARGET_FORMS, type CoverSet, type Netlist } from "../../lib/map/index";
import { builtInFamily, type Family } from "../../lib/families/index";
import { compileSource } from "../../lib/lang/index";
import { minimize } from "../../lib/minimize/index";
import { analyse } from "../../lib/analysis/index";
import { cubeFromString, type FunctionSpec } from "../../lib/logic/index";
import { evalNetlist, inCube } from "./helpers";

const ttl = builtInFamily("ttl-std-5v")!;
const hc = builtInFamily("cmos-hc-5v")!;
const w = (width: number, perPackage: number) => ({ width, perPackage });

/** Gate types and widths of a netlist, sorted, as "AND2"-style names. */
const kinds = (n: Netlist) => n.gates.map((g) => `${g.type}${g.type === "NOT" || g.type === "BUF" ? "" : g.inputs.length}`).sort();

/** Brute force over every minterm with the independent evaluator in ./helpers: ON gives 1, OFF gives 0. */
function expectEqualsSpec(spec: FunctionSpec, net: Netlist) {
  const n = spec.inputs.length;
  for (let m = 0; m < 2 ** n; m++) {
    const v = evalNetlist(net, spec.inputs, m);
    for (const o of spec.outputs) {
      if (o.dc.some((c) => inCube(c, m))) continue;
      const got = v.get(net.outputs.find((x) => x.name === o.name)!.net);
      expect(got, `${o.name} at ${m}`).toBe(o.on.some((c) => inCube(c, m)));
    }
  }
}

function mapSource(source: string, family: Family, form: (typeof TARGET_FORMS)[number], extra: { spareInverters?: boolean; fanIn?: number } = {}) {
  const spec = compileSource(source).spec!;
  const covers = minimize(spec, { form: form === "or-and" || form === "nor" ? "pos" : "sop" });
  const r = mapCovers(covers, family, { form, spec, ...extra });
  expectEqualsSpec(spec, r.netlist);
  return r;
}

const VOTE = "inputs a, b, c\noutputs m\nm = on(3, 5, 6, 7)\n";

describe("the two-of-three vote", () => {
  // The majority function of three inputs, m = a·b + b·c + c·a (Wikipedia, "Majority function"): the textbook
  // circuit is three two-input ANDs into one three-input OR.
  it("AND–OR on standard TTL, which has no three-input OR: three AND2 and the OR as two OR2 — 5 gates, 2 packages", () => {
    // Standard TTL offers OR only two inputs wide (lib/families/builtin.ts), so the OR3 is two OR2 (common practice,
    // the k-ary tree of ceil((3 − 1)/(2 − 1)) = 2 gates); the mapper used to build 8 (four NOT, three OR2, one AND3).
    const r = mapSource(VOTE, ttl, "and-or");
    expect(kinds(r.netlist)).toEqual(["AND2", "AND2", "AND2", "OR2", "OR2"]);
    // a quad AND2 and a quad OR2 package (four gates each, lib/families/builtin.ts)
    expect(analyse(r.netlist, r.family).packages).toBe(2);
  });
  it("AND–OR on high-speed CMOS, which has an OR3: the textbook 4 gates", () => {
    const r = mapSource(VOTE, hc, "and-or");
    expect(kinds(r.netlist)).toEqual(["AND2", "AND2", "AND2", "OR3"]);
  });
  it("NAND–NAND: three NAND2 into a NAND3 — 4 gates, no inverter", () => {
    // De Morgan's laws: a·b + b·c + c·a = ((a·b)' · (b·c)' · (c·a)')'
    const r = mapSource(VOTE, ttl, "nand");
    expect(kinds(r.netlist)).toEqual(["NAND2", "NAND2", "NAND2", "NAND3"]);
  });
  it("NOR–NOR of the product of sums (a + b)(b + c)(c + a): three NOR2 into a NOR3 — 4 gates", () => {
    // the majority function is self-dual (Wikipedia, "Majority function"), so its POS has the same shape; De Morgan:
    // (a + b)(b + c)(c + a) = ((a + b)' + (b + c)' + (c + a)')'
    const r = mapSource(VOTE, ttl, "nor");
    expect(kinds(r.netlist)).toEqual(["NOR2", "NOR2", "NOR2", "NOR3"]);
  });
});

describe("realisations of one wide operation", () => {
  const family = (gates: Family["gates"]): Family => ({ id: "bench", name: "Bench family", fanOut: 10, gates });
  it("an OR of three inputs from OR2 gates: a tree of two, not an AND3 of inverted inputs (5 gates)", () => {
    // common practice: the k-ary tree, ceil((n − 1)/(k − 1)) = 2 gates; De Morgan's form a + b + c = (a'·b'·c')' costs
    // three input inverters, the AND3 and an output inverter
    const r = mapSource("inputs a, b, c\noutputs f\nf = a + b + c\n", ttl, "and-or");
    expect(kinds(r.netlist)).toEqual(["OR2", "OR2"]);
  });
  it("a wider gate with the spare input tied: an OR4 with one input at 0 for an OR of three", () => {
    // common practice: unused OR/NOR inputs tie low, unused AND/NAND inputs tie high
    const f = family([{ type: "AND", widths: [w(2, 4)] }, { type: "OR", widths: [w(2, 4), w(4, 2)] }, { type: "NOT", widths: [w(1, 6)] }]);
    const r = mapSource("inputs a, b, c\noutputs f\nf = a + b + c\n", f, "and-or");
    expect(kinds(r.netlist)).toEqual(["OR4"]);
    expect(r.netlist.gates[0]!.inputs.filter((x) => x === "0").length).toBe(1);
  });
  it("a NOR and a NOT when the family has no OR three wide (mixed form): 2 gates", () => {
    // De Morgan's laws / definition of NOR: a + b + c = ((a + b + c)')'; the alternatives from NAND2 need more
    const f = family([{ type: "NAND", widths: [w(2, 4)] }, { type: "NOR", widths: [w(3, 3)] }, { type: "NOT", widths: [w(1, 6)] }]);
    const r = mapSource("inputs a, b, c\noutputs f\nf = a + b + c\n", f, "mixed", { spareInverters: false });
    expect(kinds(r.netlist)).toEqual(["NOR3", "NOT"]);
    // with spare gates as inverters, the NOT takes the free places of the NOR3 package (inputs tied low): one package
    const s = mapSource("inputs a, b, c\noutputs f\nf = a + b + c\n", f, "mixed");
    expect(kinds(s.netlist)).toEqual(["NOR3", "NOR3"]);
    expect(analyse(s.netlist, s.family).packages).toBe(1);
  });
  it("an OR as a NAND of inverted inputs when complemented inputs come from outside: 1 gate", () => {
    // De Morgan's laws: a + b = (a'·b')'
    const spec = compileSource("inputs a, b\noutputs f\nf = a + b\n").spec!;
    const r = mapCovers(minimize(spec), ttl, { form: "nand", spec, complementedInputs: true });
    expect(kinds(r.netlist)).toEqual(["NAND2"]);
    expect(r.netlist.gates[0]!.inputs.sort()).toEqual(["a_n", "b_n"]);
  });
  it("every realisation priced is reported, the first being the widest-gate one, and the cheapest is kept", () => {
    const r = mapSource(VOTE, ttl, "and-or");
    expect(r.realisations.length).toBeGreaterThanOrEqual(2);
    expect(r.realisations.filter((x) => x.chosen).length).toBe(1);
    const chosen = r.realisations.find((x) => x.chosen)!;
    expect(chosen.gates).toBe(r.netlist.gates.length);
    // the widest-gate realisation is the 8-gate one (four NOT, three OR2, one AND3) the mapper built before
    expect(r.realisations[0]!.gates).toBe(8);
    for (const x of r.realisations) expect(chosen.gates).toBeLessThanOrEqual(x.gates);
  });
});

describe("spare gates as inverters", () => {
  const INTERLOCK = compileSource(
    // the chamber interlock of the demo (lib/lang/examples/chamber-interlock.fnb), shortened to its equations
    [
      "inputs upper_shut, lower_shut, level_upper, level_lower, fill, override_key, estop",
      "outputs open_upper, open_lower, paddles_upper, paddles_lower, alarm",
      "open_upper = estop' * lower_shut * (level_upper + override_key)",
      "open_lower = estop' * upper_shut * (level_lower + override_key)",
      "paddles_upper = estop' * upper_shut * lower_shut * fill * level_upper'",
      "paddles_lower = estop' * upper_shut * lower_shut * fill' * level_lower'",
      "alarm = estop + override_key * (upper_shut * lower_shut)'",
    ].join("\n"),
  ).spec!;
  const map = (spareInverters: boolean) => {
    const covers = minimize(INTERLOCK);
    return mapCovers(covers, hc, { form: "nand", fanIn: 4, spec: INTERLOCK, spareInverters });
  };
  it("moves NOT gates into free NAND places when that saves a package; gates, loads and levels stay", () => {
    const off = map(false);
    const on = map(true);
    expectEqualsSpec(INTERLOCK, on.netlist);
    const a = analyse(off.netlist, off.family);
    const b = analyse(on.netlist, on.family);
    expect(b.gates).toBe(a.gates);
    expect(b.depth).toBe(a.depth);
    expect(b.maxLoad).toBe(a.maxLoad);
    // Package sizes from the family (lib/families/builtin.ts): six NOT to a package, four NAND2, three NAND3, two NAND4.
    const count = (x: typeof a, type: string, width: number) => x.byTypeWidth.find((r) => r.type === type && r.width === width)?.count ?? 0;
    const per: Record<string, number> = { NOT1: 6, NAND2: 4, NAND3: 3, NAND4: 2 };
    const packages = (x: typeof a) => Object.entries(per).reduce((s, [k, p]) => s + Math.ceil(count(x, k.slice(0, -1), Number(k.slice(-1))) / p), 0);
    expect(packages(a)).toBe(a.packages);
    expect(b.packages).toBe(a.packages! - 1);
    expect(packages(b)).toBe(b.packages);
    // each moved inverter is a NAND with its other inputs tied high (common practice: a NAND with its unused inputs at 1 inverts)
    const moved = on.netlist.gates.filter((g) => g.role === "inverter" && g.type === "NAND");
    expect(moved.length).toBeGreaterThan(0);
    for (const g of moved) expect(g.inputs.slice(1).every((x) => x === "1")).toBe(true);
  });
  it("leaves the inverters alone when no package is saved", () => {
    // NAND–NAND with two-input NANDs only: the 20 NAND2 fill five packages, so there is no free place
    const covers = minimize(INTERLOCK);
    const r = mapCovers(covers, hc, { form: "nand", fanIn: 2, spec: INTERLOCK });
    const off = mapCovers(covers, hc, { form: "nand", fanIn: 2, spec: INTERLOCK, spareInverters: false });
    expect(analyse(r.netlist, r.family).packages).toBe(analyse(off.netlist, off.family).packages);
    expect(r.netlist.gates.filter((g) => g.type === "NOT").length).toBe(off.netlist.gates.filter((g) => g.type === "NOT").length);
  });
});

describe("every realisation on random functions", () => {
  const cube = (n: number) => fc.array(fc.constantFrom("0", "1", "-"), { minLength: n, maxLength: n }).map((a) => a.join(""));
  const widthSets = fc.subarray([2, 3, 4, 5, 8], { minLength: 1 });
  const arb = fc.integer({ min: 2, max: 6 }).chain((n) =>
    fc.record({
      n: fc.constant(n),
      outs: fc.array(fc.record({ form: fc.constantFrom("sop" as const, "pos" as const), cubes: fc.array(cube(n), { minLength: 1, maxLength: 8 }) }), { minLength: 1, maxLength: 3 }),
      form: fc.constantFrom(...TARGET_FORMS),
      and: widthSets,
      or: widthSets,
      nand: widthSets,
      nor: widthSets,
      fanOut: fc.integer({ min: 2, max: 8 }),
      rails: fc.boolean(),
      spare: fc.boolean(),
    }),
  );
  it("equal the covers and never use more gates than the widest-gate realisation (the mapper's earlier one)", () => {
    // brute force with the independent evaluator in ./helpers; the figures of the first realisation are its finished ones
    fc.assert(
      fc.property(arb, (c) => {
        const family: Family = {
          id: "random",
          name: "Random family",
          fanOut: c.fanOut,
          gates: [
            { type: "AND", widths: c.and.map((x) => w(x, 2)) },
            { type: "OR", widths: c.or.map((x) => w(x, 2)) },
            { type: "NAND", widths: c.nand.map((x) => w(x, 3)) },
            { type: "NOR", widths: c.nor.map((x) => w(x, 3)) },
            { type: "NOT", widths: [w(1, 6)] },
            { type: "BUF", widths: [w(1, 6)] },
          ],
        };
        const letters = Array.from({ length: c.n }, (_, i) => String.fromCharCode(97 + i));
        const covers: CoverSet = { inputs: letters, outputs: c.outs.map((o, i) => ({ name: `y${i}`, form: o.form, cubes: o.cubes.map(cubeFromString) })) };
        const r = mapCovers(covers, family, { form: c.form, complementedInputs: c.rails, spareInverters: c.spare });
        for (let m = 0; m < 2 ** c.n; m++) {
          const v = evalNetlist(r.netlist, letters, m);
          for (const o of covers.outputs) {
            const want = o.form === "sop" ? o.cubes.some((q) => inCube(q, m)) : o.cubes.every((q) => !inCube({ value: (~q.value & q.mask) >>> 0, mask: q.mask }, m));
            expect(v.get(r.netlist.outputs.find((x) => x.name === o.name)!.net)).toBe(want);
          }
        }
        const first = r.realisations[0]!;
        expect(first.estimated).toBe(false);
        expect(r.netlist.gates.length).toBeLessThanOrEqual(first.gates);
        if (r.netlist.gates.length === first.gates && first.packages !== null) {
          expect(analyse(r.netlist, r.family).packages).toBeLessThanOrEqual(first.packages);
        }
      }),
      { numRuns: 200 },
    );
  });
});
