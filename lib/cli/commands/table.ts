/**
 * `npm run -s cli -- table FILE` (FILE or - for standard input): prints
 * {"inputs", "outputs": [{"name", "on", "dc"}]} with minterm indices as JSON.
 * A source with errors prints the check JSON instead and exits 1. Tables stop
 * at TRUTH_TABLE_MAX_INPUTS (20) inputs.
 */
import type { CliIO } from "../main";
import { compileSource } from "../../lang/index";
import { tableFromCubes, tableMinterms, TRUTH_TABLE_MAX_INPUTS } from "../../logic/index";

export async function run(args: string[], io: CliIO): Promise<number> {
  const file = args[0];
  if (!file || args.length > 1) {
    io.err("usage: npm run -s cli -- table FILE   (use - to read standard input)");
    return 2;
  }
  const result = compileSource(io.readSource(file));
  if (!result.spec) {
    io.out(JSON.stringify({ ok: false, diagnostics: result.diagnostics }, null, 2));
    return 1;
  }
  const { inputs, outputs } = result.spec;
  const n = inputs.length;
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
