/**
 * `npm run -s cli -- map FILE --family ID [--form and-or|nand|nor|or-and|mixed] [--fanin N] [--fanout N]
 *  [--no-spare-inverters] [--multilevel [--aim gates|levels]] [--format json|verilog|vhdl|csv] [--library NAME=DIR]...` maps the minimized design onto a family and prints the JSON
 * netlist {"inputs", "outputs", "gates", "stats", "warnings"} or the chosen export.
 * --fanin and --fanout override the family's limits: --fanin N caps the gate widths on offer at N
 * (a family that lists no gates offers every width from 2 to N), --fanout N replaces the derived
 * fan-out in unit loads. Output pins count 1 unit load each; complemented inputs are not assumed.
 * Inverters take spare places of NAND/NOR/XOR/XNOR packages already used when that saves inverter
 * packages, unless --no-spare-inverters is given.
 * --multilevel maps the factored multi-level network (lib/factor) instead of the two-level covers —
 * the same JSON format — keeping the fewest gates, or with --aim levels the fewest levels; the
 * two-level structure is kept when nothing factored is better by that aim.
 * Language errors print the `check` JSON and exit 1; a mapping or limit error prints
 * {"error": {"code", "message"}} and exits 1; an unknown family or bad option exits 2.
 */
import type { CliIO } from "../main";
import { compileNow } from "../../pipeline";
import { MAP_OPTIONS_USAGE, parseMapArgs, unitFromFile } from "../options";
import { LIBRARY_USAGE, libraryResolver, takeLibraryOptions } from "../libraries";

const USAGE = `usage: npm run -s cli -- map FILE ${MAP_OPTIONS_USAGE} [--format json|verilog|vhdl|csv] ${LIBRARY_USAGE}`;

export async function run(args: string[], io: CliIO): Promise<number> {
  const taken = takeLibraryOptions(args);
  const parsed = typeof taken === "string" ? taken : parseMapArgs(taken.args, { fileNames: ["FILE"], format: true });
  if (typeof parsed === "string" || typeof taken === "string") {
    io.err(`${parsed}\n${USAGE}`);
    return 2;
  }
  const file = parsed.files[0]!;
  const source = io.readSource(file);
  const resolve = await libraryResolver(source, taken.libraries);
  const r = compileNow({
    source, family: parsed.family, settings: parsed.settings, exports: [parsed.format], unitName: unitFromFile(file), compare: false,
    ...(resolve ? { resolve } : {}),
  });
  if (!r.spec) {
    io.out(JSON.stringify({ ok: false, diagnostics: r.diagnostics }, null, 2));
    return 1;
  }
  if (!r.result) {
    io.out(JSON.stringify({ error: r.error }, null, 2));
    return 1;
  }
  io.out(r.result.exports[parsed.format]!);
  return 0;
}
