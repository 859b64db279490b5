/**
 * `npm run -s cli -- import FILE [--outputs y,z] [--kind csv|verilog]`:
 * reads a truth table (CSV, or tab-separated cells) or a Verilog module and
 * prints the design source on standard output, exit 0. Refused: the
 * diagnostics as JSON on standard error, exit 1. The kind follows the file
 * name (.v is Verilog, anything else a table); FILE - reads standard input as
 * a table unless --kind says otherwise. Without --outputs the last column is
 * the only output.
 */
import path from "node:path";
import type { CliIO } from "../main";
import { importDesign, kindOfFile, type ImportKind } from "../../import/index";

const USAGE = "usage: npm run -s cli -- import FILE [--outputs y,z] [--kind csv|verilog]   (use - to read standard input)";

export async function run(args: string[], io: CliIO): Promise<number> {
  let file: string | undefined;
  let outputs: string[] | undefined;
  let kind: ImportKind | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === "--outputs" || a.startsWith("--outputs=")) {
      const v = a.includes("=") ? a.slice(a.indexOf("=") + 1) : args[++i];
      if (!v) return usage(io, "--outputs needs a comma-separated list of column names");
      outputs = v.split(",").map((s) => s.trim()).filter(Boolean);
    } else if (a === "--kind" || a.startsWith("--kind=")) {
      const v = a.includes("=") ? a.slice(a.indexOf("=") + 1) : args[++i];
      if (v !== "csv" && v !== "verilog") return usage(io, "--kind is csv or verilog");
      kind = v;
    } else if (!file && (a === "-" || !a.startsWith("-"))) {
      file = a;
    } else {
      return usage(io, `unknown argument ${a}`);
    }
  }
  if (!file) return usage(io);
  const k = kind ?? (file === "-" ? "csv" : kindOfFile(file));
  if (k === "verilog" && outputs) return usage(io, "--outputs is for truth tables; a Verilog module declares its outputs");
  const name = file === "-" ? undefined : path.basename(file);
  const result = importDesign(k, io.readSource(file), { outputs, name });
  if (result.source === null) {
    io.err(JSON.stringify({ ok: false, diagnostics: result.diagnostics }, null, 2));
    return 1;
  }
  for (const d of result.diagnostics) io.err(`warning (line ${d.line}): ${d.message}`);
  io.out(result.source);
  return 0;
}

function usage(io: CliIO, why?: string): number {
  io.err(why ? `${why}\n${USAGE}` : USAGE);
  return 2;
}
