// Shared by the import tests: a truth table worked out from a specification's
// ON and DC cubes by brute force, minterm by minterm, without lib/import.
import { compileSource } from "../../lib/lang/index";
import type { Cube, FunctionSpec } from "../../lib/logic/index";

export const inCube = (c: Cube, m: number) => ((m ^ c.value) & c.mask) === 0;

/** Per output, per minterm: "1", "0" or "-" (don't-care). */
export function bruteTable(spec: FunctionSpec): string[][] {
  const size = 2 ** spec.inputs.length;
  return spec.outputs.map((o) =>
    Array.from({ length: size }, (_, m) => (o.dc.some((c) => inCube(c, m)) ? "-" : o.on.some((c) => inCube(c, m)) ? "1" : "0")),
  );
}

/** Compiles a source and fails loudly on any error. */
export function specOf(source: string): FunctionSpec {
  const r = compileSource(source);
  const errors = r.diagnostics.filter((d) => d.severity === "error");
  if (!r.spec || errors.length) throw new Error(`source did not compile: ${JSON.stringify(errors)}\n${source}`);
  return r.spec;
}
