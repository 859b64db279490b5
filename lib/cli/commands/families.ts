/**
 * `npm run -s cli -- families` prints {"families": [{"id", "name", "fanIn", "fanOut", ...}]}:
 * each built-in family with its figures, derived figures (with formulas) and sources.
 *
 * `npm run -s cli -- families --matrix` prints the driver → receiver
 * compatibility of every pair of built-in families, a family with itself
 * included: {"pairs": [{"driver", "receiver", "nmhV", "nmlV", "fanOutHigh",
 * "fanOutLow", "verdict"}]}, where verdict is "compatible", "small-margin",
 * "not-compatible" or "unknown".
 */
import type { CliIO } from "../main";
import { BUILT_IN_FAMILIES, compatibilityMatrix, deriveFamily } from "../../families";

const USAGE = "usage: npm run -s cli -- families [--matrix]";

export async function run(args: string[], io: CliIO): Promise<number> {
  const matrix = args.length === 1 && args[0] === "--matrix";
  if (args.length > 0 && !matrix) {
    io.err(`families takes no arguments but --matrix; got ${args.join(" ")}\n${USAGE}`);
    return 2;
  }
  if (matrix) {
    const pairs = compatibilityMatrix(BUILT_IN_FAMILIES).map((p) => ({
      driver: p.driver,
      receiver: p.receiver,
      nmhV: p.nmhV,
      nmlV: p.nmlV,
      fanOutHigh: p.fanOutHigh,
      fanOutLow: p.fanOutLow,
      verdict: p.verdict,
    }));
    io.out(JSON.stringify({ pairs }, null, 2));
    return 0;
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
