/**
 * Bench section "mapping": how the stages after the minimizer grow with the
 * gates they build. For n-input parity (2^(n−1) products of n literals, the
 * worst case of a two-level cover) and magnitude comparators, the minimized
 * cover is mapped onto a family, analysed, verified and exported; each stage
 * is timed as the fastest of a few runs, and the time per gate built shows
 * whether a stage grows linearly (flat µs per gate) or faster.
 *
 * Verification is exhaustive up to 20 inputs: every net's truth table has
 * 2^n / 32 words, so its time per gate doubles with each input by nature.
 *
 * Each row ends with a fingerprint of the netlist (FNV-1a over its JSON), so
 * two runs of the bench, before and after a change, show whether the
 * netlists themselves changed.
 */
import type { FunctionSpec } from "../logic";
import { minimize } from "../minimize";
import { builtInFamily } from "../families";
import { mapCovers, type Netlist } from "../map";
import { analyse } from "../analysis";
import { toCsv, toJsonDocument, toVerilog, toVhdl } from "../export";
import { comparator, parity } from "./cases";

/** 32-bit FNV-1a of the netlist's JSON, as 8 hex digits. */
export function netlistFingerprint(netlist: Netlist): string {
  const s = JSON.stringify(netlist);
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, "0");
}

/** Milliseconds of the fastest of up to `runs` runs, stopping once `budgetMs` have been spent. */
function fastest<T>(run: () => T, runs: number, budgetMs: number): { ms: number; value: T } {
  let best = Infinity;
  let value: T | undefined;
  let spent = 0;
  for (let i = 0; i < runs && (i === 0 || spent < budgetMs); i++) {
    const t0 = performance.now();
    value = run();
    const ms = performance.now() - t0;
    spent += ms;
    if (ms < best) best = ms;
  }
  return { ms: best, value: value as T };
}

export interface MappingRow {
  name: string;
  inputs: number;
  products: number;
  gates: number;
  packages: number | null;
  depth: number;
  mapMs: number;
  analyseMs: number;
  verifyMs: number;
  exportMs: number;
  fingerprint: string;
}

/** Maps, analyses, verifies and exports one case on the family; times each stage. */
export function mappingRow(name: string, spec: FunctionSpec, familyId: string, runs: number): MappingRow {
  const family = builtInFamily(familyId);
  if (!family) throw new Error(`no built-in family ${familyId}`);
  const covers = minimize(spec);
  const budget = 1500;
  const mapped = fastest(() => mapCovers(covers, family, { verify: false }), runs, budget);
  const m = mapped.value;
  const analysed = fastest(() => analyse(m.netlist, m.family, { fanOut: m.fanOut, outputPinLoad: m.outputPinLoad }), runs, budget);
  // The mapper verifies inside mapCovers; its share is the difference to the unverified run.
  const verified = fastest(() => mapCovers(covers, family, { spec }), runs, budget);
  const exported = fastest(
    () => {
      const doc = toJsonDocument(m.netlist, analysed.value, []);
      return toVerilog(m.netlist).length + toVhdl(m.netlist).length + toCsv(m.netlist).length + JSON.stringify(doc).length;
    },
    runs,
    budget,
  );
  if (!verified.value.verification?.ok) throw new Error(`${name}: the mapped netlist failed verification`);
  return {
    name,
    inputs: spec.inputs.length,
    products: new Set(covers.outputs.flatMap((o) => o.cubes.map((c) => `${c.value}/${c.mask}`))).size,
    gates: analysed.value.gates,
    packages: analysed.value.packages,
    depth: analysed.value.depth,
    mapMs: mapped.ms,
    analyseMs: analysed.ms,
    verifyMs: Math.max(0, verified.ms - mapped.ms),
    exportMs: exported.ms,
    fingerprint: netlistFingerprint(m.netlist),
  };
}

const pad = (s: string | number, w: number) => String(s).padStart(w);
const ms = (x: number) => (x < 10 ? x.toFixed(1) : x.toFixed(0));

/** Prints the mapping section: parity 8..16 and the 8-bit (16-input) magnitude comparator on standard TTL. */
export function mappingSection(quick: boolean, log: (line: string) => void = console.log): MappingRow[] {
  const familyId = "ttl-std-5v";
  const cases: { name: string; spec: FunctionSpec }[] = [];
  for (const n of quick ? [8, 10, 12, 14] : [8, 10, 11, 12, 13, 14, 15, 16]) cases.push({ name: `parity ${n}`, spec: parity(n).spec });
  cases.push({ name: "comparator 8-bit", spec: comparator(8).spec });
  log(`\nmapping on ${familyId}, and-or form: time per stage (fastest of a few runs) and per gate built`);
  const header = `${"case".padEnd(18)}${pad("in", 4)}${pad("terms", 7)}${pad("gates", 8)}${pad("pkgs", 7)}${pad("depth", 6)}${pad("map ms", 9)}${pad("anal ms", 9)}${pad("µs/gate", 9)}${pad("verify ms", 11)}${pad("export ms", 11)}  netlist`;
  log(header);
  log("-".repeat(header.length));
  const rows: MappingRow[] = [];
  for (const c of cases) {
    const r = mappingRow(c.name, c.spec, familyId, quick ? 2 : 4);
    rows.push(r);
    log(
      `${r.name.padEnd(18)}${pad(r.inputs, 4)}${pad(r.products, 7)}${pad(r.gates, 8)}${pad(r.packages ?? "-", 7)}${pad(r.depth, 6)}${pad(ms(r.mapMs), 9)}${pad(ms(r.analyseMs), 9)}${pad(((1000 * (r.mapMs + r.analyseMs)) / r.gates).toFixed(1), 9)}${pad(ms(r.verifyMs), 11)}${pad(ms(r.exportMs), 11)}  ${r.fingerprint}`,
    );
  }
  const par = rows.filter((r) => r.name.startsWith("parity"));
  const first = par[0]!;
  const last = par[par.length - 1]!;
  const perGate = (r: MappingRow) => (r.mapMs + r.analyseMs) / r.gates;
  log(
    `  map + analyse from ${first.name} to ${last.name}: gates ×${(last.gates / first.gates).toFixed(0)}, time ×${((last.mapMs + last.analyseMs) / (first.mapMs + first.analyseMs)).toFixed(0)}, ` +
      `time per gate ×${(perGate(last) / perGate(first)).toFixed(1)} (about 1 = linear in the gates built)`,
  );
  log("  verification is exhaustive up to 20 inputs: 2^n / 32 words per net, so its time per gate doubles with each input");
  return rows;
}
