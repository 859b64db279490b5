import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { compileDesign, designSettingsSchema } from "../../lib/pipeline/index";
import { compileDesignAsync } from "../../lib/pipeline/async";
import type { Family } from "../../lib/families/index";

const LAMPS = readFileSync("lib/lang/examples/status-lamps.fnb", "utf8");
const PRIORITY = readFileSync("lib/lang/examples/fault-priority.fnb", "utf8");

describe("compileDesign", () => {
  it("runs every stage and returns verified results", () => {
    const r = compileDesign(PRIORITY, { familyId: "cmos-hc-5v", form: "nand", fanIn: 4 }, { exports: ["verilog", "vhdl", "csv", "json"] });
    expect(r.ok).toBe(true);
    expect(r.verification?.ok).toBe(true);
    expect(r.minimized?.outputs.map((o) => o.form)).toEqual(["sop", "sop", "sop", "sop"]);
    expect(Object.keys(r.exports ?? {}).sort()).toEqual(["csv", "json", "verilog", "vhdl"]);
    expect(r.analysis?.caution).toMatch(/data sheets/);
    expect(r.document?.stats.gates).toBe(r.netlist?.gates.length);
  });
  it("asks the minimizer for POS for the OR-AND and NOR forms", () => {
    for (const form of ["or-and", "nor"] as const) {
      const r = compileDesign(LAMPS, { familyId: "ttl-ls-5v", form });
      expect(r.ok, JSON.stringify(r.error)).toBe(true);
      expect(r.minimized?.outputs.every((o) => o.form === "pos")).toBe(true);
    }
  });
  it("reports errors as values", () => {
    expect(compileDesign("inputs a\noutputs f\nf = b\n", { familyId: "ttl-std-5v" }).error?.code).toBe("language");
    const fam = compileDesign(LAMPS, { familyId: "relay" });
    expect(fam.error?.code).toBe("family");
    expect(fam.error?.message).toMatch(/ttl-std-5v/);
  });
  it("uses a user's family with only a fan-in and a fan-out", () => {
    const user: Family = { id: "bench-rule", name: "Bench rule", fanIn: 3, fanOut: 4 };
    const r = compileDesign(PRIORITY, { familyId: "bench-rule", form: "mixed" }, { families: [user] });
    expect(r.ok).toBe(true);
    for (const g of r.netlist!.gates) expect(g.inputs.length).toBeLessThanOrEqual(3);
    expect(r.analysis?.criticalPath.delay.value).toBeNull();
    expect(r.warnings.join(" ")).toMatch(/not estimated/);
  });
  it("validates settings with the schema", () => {
    expect(designSettingsSchema.safeParse({ familyId: "ttl-std-5v", form: "nand", fanIn: 4 }).success).toBe(true);
    expect(designSettingsSchema.safeParse({ familyId: "ttl-std-5v", fanIn: 1 }).success).toBe(false);
    expect(designSettingsSchema.safeParse({ familyId: "ttl-std-5v", form: "pla" }).success).toBe(false);
  });
});

describe("compileDesignAsync", () => {
  it("gives the same netlist as the synchronous pipeline", async () => {
    const settings = { familyId: "ttl-std-5v", form: "and-or" as const };
    const a = await compileDesignAsync(PRIORITY, settings);
    const s = compileDesign(PRIORITY, settings);
    expect(a.ok).toBe(true);
    expect(a.netlist).toEqual(s.netlist);
  });
  it("returns a limit error when cancelled", async () => {
    const ctl = new AbortController();
    ctl.abort();
    const r = await compileDesignAsync(PRIORITY, { familyId: "ttl-std-5v" }, { signal: ctl.signal });
    expect(r.error?.code).toBe("limit");
  });
});
