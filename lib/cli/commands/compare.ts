/**
 * `npm run -s cli -- compare OLD NEW --family ID [--form ...] [--fanin N] [--fanout N] [--multilevel ...] [--library NAME=DIR]...`
 * maps both designs with the same options (those of `map`; use lines answered as lib/cli/libraries.ts
 * says, each file's own, so OLD and NEW may name different revisions of a block) and prints
 * {"from": stats, "to": stats, "delta": {gates, depth, packages, transistors, delayNs, staticMw, dynamicMw},
 *  "outputs": [{"name", "from": {products, literals} | null, "to": {...} | null}]}
 * where each side's stats are exactly what `map --format json` prints in its "stats" for that file,
 * and each delta is NEW − OLD (null when a side has no such figure). Exit 0 whatever grew: the
 * script that calls it decides what fails a build. A language error in either file prints
 * {"ok": false, "file", "diagnostics"} and exits 1; a mapping or limit error prints
 * {"error": {"code", "message"}, "file"} and exits 1; an unknown family or a bad option exits 2.
 */
import type { CliIO } from "../main";
import { compileNow, type CompileResult } from "../../pipeline";
import type { Family } from "../../families";
import { mapStatsDelta } from "../../review";
import { MAP_OPTIONS_USAGE, parseMapArgs, type MapArgs } from "../options";
import type { LibraryResolver } from "../../lang";
import { LIBRARY_USAGE, libraryResolver, takeLibraryOptions } from "../libraries";

const USAGE = `usage: npm run -s cli -- compare OLD NEW ${MAP_OPTIONS_USAGE} ${LIBRARY_USAGE}`;

type Outcome = { ok: true; result: CompileResult } | { ok: false; code: number };

function mapOne(io: CliIO, file: string, source: string, family: Family, settings: MapArgs["settings"], resolve: LibraryResolver | undefined): Outcome {
  const r = compileNow({ source, family, settings, compare: false, ...(resolve ? { resolve } : {}) });
  if (!r.spec) {
    io.out(JSON.stringify({ ok: false, file, diagnostics: r.diagnostics }, null, 2));
    return { ok: false, code: 1 };
  }
  if (!r.result) {
    io.out(JSON.stringify({ error: r.error ?? { code: "mapping", message: "no netlist" }, file }, null, 2));
    return { ok: false, code: 1 };
  }
  return { ok: true, result: r.result };
}

export async function run(args: string[], io: CliIO): Promise<number> {
  const taken = takeLibraryOptions(args);
  const parsed = typeof taken === "string" ? taken : parseMapArgs(taken.args, { fileNames: ["OLD", "NEW"], format: false });
  if (typeof parsed === "string" || typeof taken === "string") {
    io.err(`${parsed}\n${USAGE}`);
    return 2;
  }
  const [oldFile, newFile] = parsed.files as [string, string];
  if (oldFile === "-" && newFile === "-") {
    io.err(`standard input can stand for one of the files, not both\n${USAGE}`);
    return 2;
  }
  const oldSource = io.readSource(oldFile);
  const newSource = io.readSource(newFile);
  const a = mapOne(io, oldFile, oldSource, parsed.family, parsed.settings, await libraryResolver(oldSource, taken.libraries));
  if (!a.ok) return a.code;
  const b = mapOne(io, newFile, newSource, parsed.family, parsed.settings, await libraryResolver(newSource, taken.libraries));
  if (!b.ok) return b.code;
  const from = a.result.document.stats;
  const to = b.result.document.stats;
  const cover = (r: CompileResult, name: string) => {
    const o = r.covers.outputs.find((x) => x.name === name);
    return o ? { products: o.products, literals: o.literals } : null;
  };
  const names = b.result.covers.outputs.map((o) => o.name);
  for (const o of a.result.covers.outputs) if (!names.includes(o.name)) names.push(o.name);
  const report = {
    from,
    to,
    delta: mapStatsDelta(from, to),
    outputs: names.map((name) => ({ name, from: cover(a.result, name), to: cover(b.result, name) })),
  };
  io.out(JSON.stringify(report, null, 2));
  return 0;
}
