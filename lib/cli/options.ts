/**
 * The mapping options that `map` and `compare` share: --family ID (required),
 * --form, --fanin N, --fanout N, --no-spare-inverters, --multilevel [--aim gates|levels] and, where the
 * command prints files, --format.
 * Values may follow the flag or be joined with "=" (--fanin=3).
 */
import { BUILT_IN_FAMILIES, type Family } from "../families";
import { TARGET_FORMS, type TargetForm } from "../map";
import type { DesignSettings, ExportFormat } from "../pipeline";

export const FORMATS: ExportFormat[] = ["json", "verilog", "vhdl", "csv"];

/** The options part of a usage line. */
export const MAP_OPTIONS_USAGE = "--family ID [--form and-or|nand|nor|or-and|mixed] [--fanin N] [--fanout N] [--no-spare-inverters] [--multilevel [--aim gates|levels]]";

export interface MapArgs {
  /** The positional arguments (file names, "-" for standard input), in order. */
  files: string[];
  /** The built-in family named by --family. */
  family: Family;
  settings: DesignSettings;
  format: ExportFormat;
}

/**
 * Parses the shared options and exactly `files` positional arguments (named
 * by `fileNames` in messages). `format`: whether --format is accepted.
 * Returns the parsed arguments, or a message saying what to change.
 */
export function parseMapArgs(args: string[], opts: { fileNames: string[]; format: boolean }): MapArgs | string {
  const files: string[] = [];
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
    } else if (flag === "--multilevel") {
      settings.structure = "factored";
    } else if (flag === "--aim") {
      const v = value();
      if (v !== "gates" && v !== "levels") return `--aim takes gates or levels, not ${v ?? "nothing"}`;
      settings.aim = v;
    } else if (flag === "--no-spare-inverters") {
      settings.spareInverters = false;
    } else if (flag === "--format" && opts.format) {
      const v = value();
      if (!FORMATS.includes(v as ExportFormat)) return `--format takes ${FORMATS.join(", ")}, not ${v ?? "nothing"}`;
      format = v as ExportFormat;
    } else if (flag.startsWith("--")) {
      return `unknown option ${flag}`;
    } else if (files.length < opts.fileNames.length) {
      files.push(a);
    } else {
      return opts.fileNames.length === 1
        ? `only one ${opts.fileNames[0]} is taken; got ${files[0]} and ${a}`
        : `only ${opts.fileNames.join(" and ")} are taken; ${a} is one too many`;
    }
  }
  if (files.length < opts.fileNames.length) {
    const missing = opts.fileNames.slice(files.length).join(" and ");
    return `${missing} ${opts.fileNames.length - files.length === 1 ? "is" : "are"} missing (use - to read standard input)`;
  }
  if (settings.aim !== undefined && settings.structure !== "factored") return "--aim applies to --multilevel; add --multilevel";
  const ids = BUILT_IN_FAMILIES.map((f) => f.id).join(", ");
  if (family === undefined) return `--family is missing; the families are: ${ids}`;
  const fam = BUILT_IN_FAMILIES.find((f) => f.id === family);
  if (!fam) return `unknown family "${family}"; the families are: ${ids}`;
  return { files, family: fam, settings, format };
}

/** A Verilog/VHDL unit name from a file name ("-" gives none). */
export function unitFromFile(file: string): string | undefined {
  if (file === "-") return undefined;
  const base = file.split(/[\\/]/).pop() ?? file;
  return base.replace(/\.[^.]*$/, "");
}
