// Regression guard for the mapper's output: a fixed corpus (the demo designs and
// small structured functions, on every built-in family, in every form, with and
// without tight limits) is mapped, and each netlist's SHA-256 (with its gate,
// package and depth figures, for a readable diff) must equal the one recorded in
// fingerprints.json. A speed change must leave the file as it is; a change that
// means to alter netlists regenerates it with FANBOUND_UPDATE_FINGERPRINTS=1 and
// says so in its commit. Common practice (golden files), no outside source: the
// correctness of each netlist is checked elsewhere (verification, the other tests).
import { createHash } from "node:crypto";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { compileSource } from "../../lib/lang/index";
import { minimize } from "../../lib/minimize/index";
import { mapCovers, TARGET_FORMS, type MapOptions } from "../../lib/map/index";
import { analyse } from "../../lib/analysis/index";
import { BUILT_IN_FAMILIES } from "../../lib/families/index";
import { adder, comparator, mux, parity } from "../../lib/bench/cases";
import type { FunctionSpec } from "../../lib/logic/index";

const file = path.join(import.meta.dirname, "fingerprints.json");

function corpus(): { name: string; spec: FunctionSpec }[] {
  const dir = path.join(import.meta.dirname, "../../lib/lang/examples");
  const out = readdirSync(dir)
    .filter((f) => f.endsWith(".fnb"))
    .sort()
    .map((f) => ({ name: f, spec: compileSource(readFileSync(path.join(dir, f), "utf8")).spec! }));
  for (const c of [adder(2), comparator(3), parity(6), mux(2)]) out.push({ name: c.name, spec: c.spec });
  return out;
}

const OPTIONS: MapOptions[] = [{}, { fanIn: 2, fanOut: 3 }, { complementedInputs: true, outputPinLoad: 4 }];

function fingerprints(): Record<string, string> {
  const out: Record<string, string> = {};
  for (const { name, spec } of corpus()) {
    for (const form of TARGET_FORMS) {
      const covers = minimize(spec, { form: form === "or-and" || form === "nor" ? "pos" : "sop" });
      for (const family of BUILT_IN_FAMILIES) {
        for (const opt of OPTIONS) {
          const key = `${name} | ${form} | ${family.id} | ${JSON.stringify(opt)}`;
          const m = mapCovers(covers, family, { ...opt, form, spec });
          const a = analyse(m.netlist, m.family, { fanOut: m.fanOut, outputPinLoad: m.outputPinLoad });
          const hash = createHash("sha256").update(JSON.stringify([m.netlist, m.warnings])).digest("hex").slice(0, 16);
          out[key] = `gates ${a.gates} packages ${a.packages} depth ${a.depth} ${hash}`;
        }
      }
    }
  }
  return out;
}

describe("mapped netlists", () => {
  it("equal the recorded fingerprints", () => {
    const got = fingerprints();
    if (process.env.FANBOUND_UPDATE_FINGERPRINTS === "1") writeFileSync(file, JSON.stringify(got, null, 1) + "\n");
    const want = JSON.parse(readFileSync(file, "utf8")) as Record<string, string>;
    expect(Object.keys(got).length).toBeGreaterThan(500);
    expect(got).toEqual(want);
  });
});
