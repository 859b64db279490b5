import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { cancelledError, compile, compileNow, designSettingsSchema, resolveSettings, runInThread, type Executor, type Progress } from "../../lib/pipeline/index";
import { BUILT_IN_FAMILIES, type Family } from "../../lib/families/index";

const LAMPS = readFileSync("lib/lang/examples/status-lamps.fnb", "utf8");
const PRIORITY = readFileSync("lib/lang/examples/fault-priority.fnb", "utf8");
const family = (id: string) => BUILT_IN_FAMILIES.find((f) => f.id === id)!;

describe("two-level and factored structures", () => {
  const INTERLOCK = readFileSync("lib/lang/examples/chamber-interlock.fnb", "utf8");
  const hc = family("cmos-hc-5v");
  it("keeps the factored structure when the settings say so, with both structures' figures side by side", () => {
    const r = compileNow({ source: INTERLOCK, family: hc, settings: { structure: "factored" }, exports: ["verilog"] });
    expect(r.error).toBeNull();
    const res = r.result!;
    expect(res.verification?.ok).toBe(true);
    expect(res.structures.map((s) => [s.structure, s.kept])).toEqual([["two-level", false], ["factored", true]]);
    const [two, fac] = res.structures;
    // the kept structure is the one returned, and it is never worse than two-level by the aim (gates by default)
    expect(fac!.gates).toBe(res.analysis.gates);
    expect(fac!.levels).toBe(res.analysis.depth);
    expect(res.stats.gates).toBe(fac!.gates);
    expect(fac!.gates).toBeLessThanOrEqual(two!.gates);
    for (const s of res.structures) {
      expect(s.verified).toBe(true);
      expect(typeof s.delayNs).toBe("number");
      expect(typeof s.staticMw).toBe("number");
    }
    expect(res.exports.verilog).toMatch(/factored/);
  });
  it("compares without keeping the factored structure, and builds only the kept one when asked not to compare", () => {
    const r = compileNow({ source: INTERLOCK, family: hc }).result!;
    expect(r.structures.map((s) => [s.structure, s.kept])).toEqual([["two-level", true], ["factored", false]]);
    expect(r.structures[0]!.gates).toBe(r.analysis.gates);
    const alone = compileNow({ source: INTERLOCK, family: hc, compare: false }).result!;
    expect(alone.structures.map((s) => s.structure)).toEqual(["two-level"]);
    expect(alone.analysis.gates).toBe(r.analysis.gates);
  });
  it("aims at the fewest levels when asked", () => {
    const r = compileNow({ source: INTERLOCK, family: hc, settings: { structure: "factored", aim: "levels" } }).result!;
    const [two, fac] = r.structures;
    expect(fac!.levels).toBeLessThanOrEqual(two!.levels);
  });
  it("the settings schema takes the structure and the aim, and refuses others", () => {
    expect(designSettingsSchema.safeParse({ structure: "factored", aim: "levels" }).success).toBe(true);
    expect(designSettingsSchema.safeParse({ structure: "three-level" }).success).toBe(false);
    expect(designSettingsSchema.safeParse({ aim: "speed" }).success).toBe(false);
    expect(resolveSettings({})).toMatchObject({ structure: "two-level", aim: "gates" });
  });
});

describe("compileNow (the pipeline on this thread)", () => {
  it("runs every stage and returns verified results", () => {
    const r = compileNow({ source: PRIORITY, family: family("cmos-hc-5v"), settings: { form: "nand", fanIn: 4 }, exports: ["verilog", "vhdl", "csv", "json"] });
    expect(r.error).toBeNull();
    const res = r.result!;
    expect(res.verification?.ok).toBe(true);
    expect(res.stats.verified).toBe(true);
    expect(res.covers.outputs.map((o) => o.form)).toEqual(["sop", "sop", "sop", "sop"]);
    expect(Object.keys(res.exports).sort()).toEqual(["csv", "json", "verilog", "vhdl"]);
    expect(res.analysis.caution).toMatch(/data sheets/);
    expect(res.document.stats.gates).toBe(res.model.gates.length);
    expect(res.stats.gates).toBe(res.model.gates.length);
  });
  it("asks the minimizer for POS for the OR-AND and NOR forms", () => {
    for (const form of ["or-and", "nor"] as const) {
      const r = compileNow({ source: LAMPS, family: family("ttl-ls-5v"), settings: { form } });
      expect(r.error, JSON.stringify(r.error)).toBeNull();
      expect(r.result!.covers.outputs.every((o) => o.form === "pos")).toBe(true);
    }
  });
  it("returns a source with errors as its diagnostics, without running the stages", () => {
    const r = compileNow({ source: "inputs a\noutputs f\nf = b\n", family: family("ttl-std-5v") });
    expect(r.spec).toBeNull();
    expect(r.result).toBeNull();
    expect(r.diagnostics.some((d) => d.severity === "error")).toBe(true);
  });
  it("uses a user's family with only a fan-in and a fan-out", () => {
    const user: Family = { id: "bench-rule", name: "Bench rule", fanIn: 3, fanOut: 4 };
    const r = compileNow({ source: PRIORITY, family: user, settings: { form: "mixed" } });
    expect(r.error).toBeNull();
    for (const g of r.result!.model.gates) expect(g.inputs.length).toBeLessThanOrEqual(3);
    expect(r.result!.analysis.criticalPath.delay.value).toBeNull();
    expect(r.result!.warnings.join(" ")).toMatch(/not estimated/);
  });
  it("validates settings with the schema and fills in the defaults once", () => {
    expect(designSettingsSchema.safeParse({ form: "nand", fanIn: 4 }).success).toBe(true);
    expect(designSettingsSchema.safeParse({ fanIn: 1 }).success).toBe(false);
    expect(designSettingsSchema.safeParse({ form: "pla" }).success).toBe(false);
    expect(resolveSettings({ form: "nor" })).toEqual({ form: "nor", cost: "products", complementedInputs: false, outputPinLoad: 1, clockMHz: 10, activity: 0.25, heuristic: false, spareInverters: true, structure: "two-level", aim: "gates" });
    // A stored family id among the settings is not a setting.
    expect(resolveSettings({ familyId: "x" } as never)).not.toHaveProperty("familyId");
  });
});

describe("compile (the pipeline on an executor)", () => {
  it("gives the same netlist on any executor as on this thread", async () => {
    const input = { source: PRIORITY, family: family("ttl-std-5v"), settings: { form: "and-or" as const } };
    const seen: string[] = [];
    const recording: Executor = (job, control) => {
      seen.push(job.family.id);
      return runInThread(job, control);
    };
    const a = await compile(input, recording);
    expect(seen).toEqual(["ttl-std-5v"]);
    expect(a.result!.model).toEqual(compileNow(input).result!.model);
  });
  it("does not start the stages of a cancelled run, and says so", async () => {
    const ctl = new AbortController();
    ctl.abort();
    const r = await compile({ source: PRIORITY, family: family("ttl-std-5v") }, runInThread, { signal: ctl.signal });
    expect(r.result).toBeNull();
    expect(r.error?.code).toBe("cancelled");
  });
  it("calls a run stopped by its time budget a limit, in words", () => {
    const ctl = new AbortController();
    ctl.abort(Object.assign(new Error("timeout"), { name: "TimeoutError", budgetMs: 10_000 }));
    expect(cancelledError(ctl.signal)).toMatchObject({ code: "limit", what: "time limit of 10 s" });
  });
  it("reports progress by stage, with the minimizer's primes, cost and bound while it runs", async () => {
    const seen: Progress[] = [];
    const r = await compile({ source: LAMPS, family: family("ttl-std-5v") }, runInThread, { onProgress: (p) => seen.push(p) });
    const stages = seen.map((p) => p.stage).filter((s, i, all) => i === 0 || all[i - 1] !== s);
    expect(stages).toEqual(["minimize", "map", "factor", "analyse", "export"]);
    const covers = r.result!.covers;
    // Within the minimize stage: the primes once listed, then the cover found and its bound.
    const minimizing = seen.filter((p) => p.stage === "minimize");
    expect(minimizing.some((p) => p.primes === covers.primes && p.cost === undefined)).toBe(true);
    expect(minimizing.at(-1)).toEqual({ stage: "minimize", primes: covers.primes, cost: covers.cost, lowerBound: covers.lowerBound });
    expect(seen.at(-1)).toEqual({ stage: "export", primes: covers.primes, cost: covers.cost, lowerBound: covers.lowerBound });
  });
});
