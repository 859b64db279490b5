/**
 * `npm run -s cli -- map FILE --family ID [--form and-or|nand|nor|or-and|mixed] [--fanin N] [--fanout N]
 *  [--format json|verilog|vhdl|csv]` maps the minimized design onto a family and prints the JSON
 * netlist {"inputs", "outputs", "gates", "stats", "warnings"} or the chosen export.
 * --fanin and --fanout override the family's limits: --fanin N caps the gate widths on offer at N
 * (a family that lists no gates offers every width from 2 to N), --fanout N replaces the derived
 * fan-out in unit loads. Output pins count 1 unit load each; complemented inputs are not assumed.
 * Language errors print the `check` JSON and exit 1; a mapping or limit error prints
 * {"error": {"code", "message"}} and exits 1; an unknown family or bad option exits 2.
 */
import type { CliIO } from "../main";
import { BUILT_IN_FAMILIES } from "../../families";
import { TARGET_FORMS, type TargetForm } from "../../map";
import { compileNow, type DesignSettings, type ExportFormat } from "../../pipeline";
import type { Family } from "../../families";

const USAGE =
  "usage: npm run -s cli -- map FILE --family ID [--form and-or|nand|nor|or-and|mixed] [--fanin N] [--fanout N] [--format json|verilog|vhdl|csv]";
const FORMATS: ExportFormat[] = ["json", "verilog", "vhdl", "csv"];

function parseArgs(args: string[]): { file: string; family: Family; settings: DesignSettings; format: ExportFormat } | string {
  let file: string | undefined;
  let family: string | undefined;
  let format: ExportFormat = "json";
  const settings: Partial<DesignSettings> = {};
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const eq = a.indexOf("=");
    const [flag, inline] = a.startsWith("--") && eq > 0 ? [a.slice(0, eq), a.slice(eq + 1)] : [a, undefined];
    const value = (): string | undefined => inline ?? args[++i];
    const whole = (name: string): number | string => {
      const v = value();
      if (!v || !/^\d+$/.test(v) || Number(v) < 2) return `${name} takes a whole number of at least 2, not ${v ?? "nothing"}`;
      return Number(v);
    };
    if (flag === "--family") {
      family = value();
      if (!family) return "--family needs a family id";
    } else if (flag === "--form") {
      const v = value();
      if (!TARGET_FORMS.includes(v as TargetForm)) return `--form takes ${TARGET_FORMS.join(", ")}, not ${v ?? "nothing"}`;
      settings.form = v as TargetForm;
    } else if (flag === "--fanin") {
      const n = whole("--fanin");
      if (typeof n === "string") return n;
      settings.fanIn = n;
    } else if (flag === "--fanout") {
      const n = whole("--fanout");
      if (typeof n === "string") return n;
      settings.fanOut = n;
    } else if (flag === "--format") {
      const v = value();
      if (!FORMATS.includes(v as ExportFormat)) return `--format takes ${FORMATS.join(", ")}, not ${v ?? "nothing"}`;
      format = v as ExportFormat;
    } else if (flag.startsWith("--")) {
      return `unknown option ${flag}`;
    } else if (file === undefined) {
      file = a;
    } else return `only one FILE is taken; got ${file} and ${a}`;
  }
  if (file === undefined) return "FILE is missing (use - to read standard input)";
  const ids = BUILT_IN_FAMILIES.map((f) => f.id).join(", ");
  if (family === undefined) return `--family is missing; the families are: ${ids}`;
  const fam = BUILT_IN_FAMILIES.find((f) => f.id === family);
  if (!fam) return `unknown family "${family}"; the families are: ${ids}`;
  return { file, family: fam, settings, format };
}

export async function run(args: string[], io: CliIO): Promise<number> {
  const parsed = parseArgs(args);
  if (typeof parsed === "string") {
    io.err(`${parsed}\n${USAGE}`);
    return 2;
  }
  const source = io.readSource(parsed.file);
  const r = compileNow({ source, family: parsed.family, settings: parsed.settings, exports: [parsed.format], unitName: unitFromFile(parsed.file) });
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

function unitFromFile(file: string): string | undefined {
  if (file === "-") return undefined;
  const base = file.split(/[\\/]/).pop() ?? file;
  return base.replace(/\.[^.]*$/, "");
}
