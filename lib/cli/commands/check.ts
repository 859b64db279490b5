/**
 * `npm run -s cli -- check FILE [--library NAME=DIR]...` (FILE or - for
 * standard input): prints {"ok", "diagnostics"} as JSON; exit code 1 when any
 * diagnostic is an error. Use lines are answered as lib/cli/libraries.ts says.
 */
import type { CliIO } from "../main";
import { compileSource } from "../../lang/index";
import { LIBRARY_USAGE, libraryResolver, takeLibraryOptions } from "../libraries";

export async function run(argv: string[], io: CliIO): Promise<number> {
  const taken = takeLibraryOptions(argv);
  const args = typeof taken === "string" ? [] : taken.args;
  const file = args[0];
  if (typeof taken === "string" || !file || args.length > 1) {
    io.err(`${typeof taken === "string" ? `${taken}\n` : ""}usage: npm run -s cli -- check FILE ${LIBRARY_USAGE}   (use - to read standard input)`);
    return 2;
  }
  const source = io.readSource(file);
  const resolve = await libraryResolver(source, taken.libraries);
  const result = compileSource(source, resolve ? { resolve } : undefined);
  const ok = !result.diagnostics.some((d) => d.severity === "error");
  io.out(JSON.stringify({ ok, diagnostics: result.diagnostics }, null, 2));
  return ok ? 0 : 1;
}
