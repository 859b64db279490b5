/**
 * Bench section "multi-level": two-level mapping against the factored
 * structure (lib/factor) on the high-speed CMOS family (gates of 2 to 4
 * inputs, XOR2 and XNOR2), for comparators, adders, parity, an 8-to-1
 * multiplexer and the demo designs: gates, levels and packages side by side,
 * for the aim "gates" and the aim "levels", with the targets checked at the
 * end.
 */
import type { FunctionSpec } from "../logic";
import { compileSource } from "../lang";
import { minimize } from "../minimize";
import { builtInFamily } from "../families";
import { mapCovers, type MapResult } from "../map";
import { mapFactored, type FactorResult } from "../factor";
import { adder, comparator, mux, parity } from "./cases";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

/** The demo designs' example sources (lib/lang/examples). */
function demoSources(): { name: string; source: string }[] {
  const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), "../lang/examples");
  return readdirSync(dir)
    .filter((f) => f.endsWith(".fnb"))
    .sort()
    .map((f) => ({ name: f.replace(/\.fnb$/, ""), source: readFileSync(path.join(dir, f), "utf8") }));
}

interface Figures {
  gates: number;
  levels: number;
  packages: number | null;
}

const fig = (m: MapResult): Figures => {
  const r = m.realisations.find((x) => x.chosen)!;
  return { gates: r.gates, levels: r.depth, packages: r.packages };
};

export interface MultilevelRow {
  name: string;
  kind: "structured" | "demo";
  twoLevel: Figures;
  gates: FactorResult;
  levels: FactorResult;
  ms: number;
}

const pad = (s: string | number, w: number) => String(s).padStart(w);

/** Runs the section and prints its table and targets; returns the rows. */
export function multilevelSection(quick: boolean, log: (line: string) => void = console.log): MultilevelRow[] {
  const family = builtInFamily("cmos-hc-5v")!;
  const cases: { name: string; kind: MultilevelRow["kind"]; spec: FunctionSpec }[] = [];
  for (const w of [4, 6, 8]) cases.push({ name: `comparator ${w}-bit`, kind: "structured", spec: comparator(w).spec });
  for (const w of [2, 3, 4]) cases.push({ name: `adder ${w}-bit`, kind: "structured", spec: adder(w).spec });
  for (const n of quick ? [8, 12] : [8, 10, 12, 14, 16]) cases.push({ name: `parity ${n}`, kind: "structured", spec: parity(n).spec });
  cases.push({ name: "multiplexer 8:1", kind: "structured", spec: mux(3).spec });
  for (const d of demoSources()) cases.push({ name: d.name, kind: "demo", spec: compileSource(d.source).spec! });

  log(`\nmulti-level on ${family.id} (AND–OR form): two-level against factored, aim "gates" and aim "levels"`);
  const header = `${"case".padEnd(24)}${pad("two-level g/lv/pk", 19)}${pad("factored (gates)", 19)}  kept as     ${pad("factored (levels)", 19)}  kept as     ${pad("ms", 7)}`;
  log(header);
  log("-".repeat(header.length));
  const rows: MultilevelRow[] = [];
  const show = (f: Figures) => `${f.gates}/${f.levels}/${f.packages ?? "-"}`;
  for (const c of cases) {
    const covers = minimize(c.spec);
    const t0 = performance.now();
    const two = mapCovers(covers, family, { spec: c.spec });
    const g = mapFactored(c.spec, covers, family, { aim: "gates", twoLevel: two });
    const l = mapFactored(c.spec, covers, family, { aim: "levels", twoLevel: two });
    const ms = performance.now() - t0;
    for (const r of [g, l]) if (!r.mapped.verification?.ok) throw new Error(`${c.name}: the factored netlist failed verification`);
    const row: MultilevelRow = { name: c.name, kind: c.kind, twoLevel: fig(two), gates: g, levels: l, ms };
    rows.push(row);
    log(
      `${c.name.padEnd(24)}${pad(show(row.twoLevel), 19)}${pad(show(fig(g.mapped)), 19)}  ${g.structure.padEnd(11)}${pad(show(fig(l.mapped)), 19)}  ${l.structure.padEnd(11)}${pad(ms.toFixed(0), 7)}`,
    );
  }

  const byName = (n: string) => rows.find((r) => r.name === n);
  const check = (label: string, ok: boolean | undefined, detail: string) => log(`  ${ok === undefined ? "n/a " : ok ? "met " : "MISSED"} ${label}: ${detail}`);
  log("targets (factored, aim gates):");
  const c8 = byName("comparator 8-bit");
  check("8-bit magnitude comparator ≤ 120 gates", c8 && fig(c8.gates.mapped).gates <= 120, c8 ? `${fig(c8.gates.mapped).gates} gates` : "not run");
  const p16 = byName("parity 16");
  if (p16) {
    const gates = p16.gates.mapped.netlist.gates;
    const xor2 = gates.filter((x) => (x.type === "XOR" || x.type === "XNOR") && x.inputs.length === 2).length;
    check("16-input parity exactly 15 XOR2", gates.length === 15 && xor2 === 15, `${gates.length} gates, ${xor2} XOR2/XNOR2, ${fig(p16.gates.mapped).levels} levels`);
  } else check("16-input parity exactly 15 XOR2", undefined, "not run in --quick");
  const a4 = byName("adder 4-bit");
  check("4-bit adder ≤ 40 gates", a4 && fig(a4.gates.mapped).gates <= 40, a4 ? `${fig(a4.gates.mapped).gates} gates` : "not run");
  const worse = rows.filter((r) => fig(r.gates.mapped).gates > r.twoLevel.gates || fig(r.levels.mapped).levels > r.twoLevel.levels).map((r) => r.name);
  check("no case worse than its two-level result (gates for aim gates, levels for aim levels)", worse.length === 0, worse.join(", ") || "none");
  return rows;
}
