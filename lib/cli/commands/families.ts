/**
 * `npm run -s cli -- families` prints {"families": [{"id", "name", "fanIn", "fanOut", ...}]}:
 * each built-in family with its figures, derived figures (with formulas) and sources.
 */
import type { CliIO } from "../main";
import { BUILT_IN_FAMILIES, deriveFamily } from "../../families";

export async function run(args: string[], io: CliIO): Promise<number> {
  if (args.length > 0) {
    io.err(`families takes no arguments; got ${args.join(" ")}\nusage: npm run -s cli -- families`);
    return 2;
  }
  const families = BUILT_IN_FAMILIES.map((f) => {
    const d = deriveFamily(f);
    const { builtIn: _b, id: _id, name: _name, ...rest } = f;
    return {
      id: f.id,
      name: f.name,
      fanIn: d.fanIn.value,
      fanOut: d.fanOut.value,
      noiseMarginHighV: d.nmh.value,
      noiseMarginLowV: d.nml.value,
      derived: d,
      ...rest,
    };
  });
  io.out(JSON.stringify({ families }, null, 2));
  return 0;
}
