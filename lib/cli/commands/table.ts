/**
 * `npm run -s cli -- table FILE [--format json|csv] [--library NAME=DIR]...`
 * (FILE or - for standard input). json (the default) prints {"inputs", "outputs": [{"name", "on",
 * "dc"}]} with minterm indices; csv prints the full truth table (inputs then
 * outputs, - for don't-care), the layout `import` reads back. A source with
 * errors prints the check JSON instead and exits 1. JSON stops at
 * TRUTH_TABLE_MAX_INPUTS (20) inputs, CSV at TABLE_CSV_MAX_INPUTS (16).
 */
import type { CliIO } from "../main";
import { compileSource } from "../../lang/index";
import { tableFromCubes, tableMinterms, TRUTH_TABLE_MAX_INPUTS } from "../../logic/index";
import { TABLE_CSV_MAX_INPUTS, truthTableCsv } from "../../import/index";
import { LIBRARY_USAGE, libraryResolver, takeLibraryOptions } from "../libraries";

const USAGE = `usage: npm run -s cli -- table FILE [--format json|csv] ${LIBRARY_USAGE}   (use - to read standard input)`;

export async function run(argv: string[], io: CliIO): Promise<number> {
  const taken = takeLibraryOptions(argv);
  if (typeof taken === "string") {
    io.err(`${taken}\n${USAGE}`);
    return 2;
  }
  const args = taken.args;
  let file: string | undefined;
  let format: "json" | "csv" = "json";
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === "--format" || a.startsWith("--format=")) {
      const v = a.includes("=") ? a.slice(a.indexOf("=") + 1) : args[++i];
      if (v !== "json" && v !== "csv") {
        io.err(`--format is json or csv\n${USAGE}`);
        return 2;
      }
      format = v;
    } else if (!file && (a === "-" || !a.startsWith("-"))) {
      file = a;
    } else {
      io.err(USAGE);
      return 2;
    }
  }
  if (!file) {
    io.err(USAGE);
    return 2;
  }
  const source = io.readSource(file);
  const resolve = await libraryResolver(source, taken.libraries);
  const result = compileSource(source, resolve ? { resolve } : undefined);
  if (!result.spec) {
    io.out(JSON.stringify({ ok: false, diagnostics: result.diagnostics }, null, 2));
    return 1;
  }
  const { inputs, outputs } = result.spec;
  const n = inputs.length;
  if (format === "csv") {
    if (n > TABLE_CSV_MAX_INPUTS) {
      io.err(`CSV tables stop at ${TABLE_CSV_MAX_INPUTS} inputs (${2 ** TABLE_CSV_MAX_INPUTS} rows) and this design has ${n}; list the minterms with --format json, or the product terms with npm run -s cli -- minimize FILE`);
      return 1;
    }
    io.out(truthTableCsv(result.spec));
    return 0;
  }
  if (n > TRUTH_TABLE_MAX_INPUTS) {
    io.err(
      `table output stops at ${TRUTH_TABLE_MAX_INPUTS} inputs and this design has ${n}; list the product terms with npm run -s cli -- minimize FILE instead`,
    );
    return 1;
  }
  const table = {
    inputs,
    outputs: outputs.map((o) => ({
      name: o.name,
      on: tableMinterms(tableFromCubes(o.on, n), n),
      dc: tableMinterms(tableFromCubes(o.dc, n), n),
    })),
  };
  io.out(JSON.stringify(table));
  return 0;
}
