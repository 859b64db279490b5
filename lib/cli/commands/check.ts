/**
 * `npm run -s cli -- check FILE` (FILE or - for standard input): prints
 * {"ok", "diagnostics"} as JSON; exit code 1 when any diagnostic is an error.
 */
import type { CliIO } from "../main";
import { compileSource } from "../../lang/index";

export async function run(args: string[], io: CliIO): Promise<number> {
  const file = args[0];
  if (!file || args.length > 1) {
    io.err("usage: npm run -s cli -- check FILE   (use - to read standard input)");
    return 2;
  }
  const result = compileSource(io.readSource(file));
  const ok = !result.diagnostics.some((d) => d.severity === "error");
  io.out(JSON.stringify({ ok, diagnostics: result.diagnostics }, null, 2));
  return ok ? 0 : 1;
}
