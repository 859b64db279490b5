/**
 * `npm run -s cli -- minimize FILE [--form sop|pos] [--cost products|gate-inputs|fan-in=N] [--heuristic] [--library NAME=DIR]...`
 * prints {"inputs", "outputs": [{"name", "form", "cubes", "expression", "products", "literals",
 * "exact", "lowerBound"}], "shared", "ms"} as JSON. Language errors print the same JSON as
 * `check` and exit 1; a limit prints {"error": {"code": "limit", "message", "limit"}} and exits 1.
 */
import type { CliIO } from "../main";
import { compileSource } from "../../lang";
import { cubeToString } from "../../logic";
import { LimitError, minimize, type CostModel, type MinimizeOptions } from "../../minimize";
import { LIBRARY_USAGE, libraryResolver, takeLibraryOptions } from "../libraries";

const USAGE =
  `usage: npm run -s cli -- minimize FILE [--form sop|pos] [--cost products|gate-inputs|fan-in=N] [--heuristic] ${LIBRARY_USAGE}`;

function parseArgs(args: string[]): { file: string; options: MinimizeOptions } | string {
  let file: string | undefined;
  const options: MinimizeOptions = {};
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const eq = a.indexOf("=");
    const [flag, inline] = a.startsWith("--") && eq > 0 ? [a.slice(0, eq), a.slice(eq + 1)] : [a, undefined];
    const value = (): string | undefined => inline ?? args[++i];
    if (flag === "--form") {
      const v = value();
      if (v !== "sop" && v !== "pos") return `--form takes sop or pos, not ${v ?? "nothing"}`;
      options.form = v;
    } else if (flag === "--cost") {
      const v = value();
      let cost: CostModel;
      if (v === "products" || v === "gate-inputs") cost = { kind: v };
      else if (v && /^fan-in=\d+$/.test(v)) {
        const fanIn = Number(v.slice(7));
        if (fanIn < 2) return "fan-in=N needs N of at least 2";
        cost = { kind: "fan-in", fanIn };
      } else return `--cost takes products, gate-inputs or fan-in=N, not ${v ?? "nothing"}`;
      options.cost = cost;
    } else if (flag === "--heuristic") {
      options.heuristic = true;
    } else if (flag.startsWith("--")) {
      return `unknown option ${flag}`;
    } else if (file === undefined) {
      file = a;
    } else return `only one FILE is taken; got ${file} and ${a}`;
  }
  if (file === undefined) return "FILE is missing (use - to read standard input)";
  return { file, options };
}

export async function run(args: string[], io: CliIO): Promise<number> {
  const taken = takeLibraryOptions(args);
  const parsed = typeof taken === "string" ? taken : parseArgs(taken.args);
  if (typeof parsed === "string" || typeof taken === "string") {
    io.err(`${parsed}\n${USAGE}`);
    return 2;
  }
  const source = io.readSource(parsed.file);
  const resolve = await libraryResolver(source, taken.libraries);
  const compiled = compileSource(source, resolve ? { resolve } : undefined);
  const ok = !compiled.diagnostics.some((d) => d.severity === "error");
  if (!ok || !compiled.spec) {
    io.out(JSON.stringify({ ok: false, diagnostics: compiled.diagnostics }, null, 2));
    return 1;
  }
  const spec = compiled.spec;
  try {
    const r = minimize(spec, parsed.options);
    const n = spec.inputs.length;
    io.out(
      JSON.stringify(
        {
          inputs: r.inputs,
          outputs: r.outputs.map((o) => ({
            name: o.name,
            form: o.form,
            cubes: o.cubes.map((c) => cubeToString(c, n)),
            expression: o.expression,
            products: o.products,
            literals: o.literals,
            exact: o.exact,
            lowerBound: o.lowerBound,
          })),
          shared: r.shared,
          ms: r.ms,
        },
        null,
        2,
      ),
    );
    return 0;
  } catch (e) {
    if (e instanceof LimitError) {
      io.out(JSON.stringify({ error: { code: "limit", message: e.message, limit: e.limit, what: e.what } }, null, 2));
      return 1;
    }
    throw e;
  }
}
