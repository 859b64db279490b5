/**
 * The CLI runs from a bundle that esbuild makes of the TypeScript sources
 * (lib/scripts/build.mjs). Bundled code must answer exactly as the sources
 * do: the language and the pipeline are built with the CLI's own options and
 * compared with the sources on the language's golden cases and on the demo
 * designs mapped onto every built-in family; and the real command answers
 * from its bundle.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { beforeAll, describe, expect, it } from "vitest";
import { compileSource } from "../../lib/lang/index";
import { compileNow } from "../../lib/pipeline/index";
import { BUILT_IN_FAMILIES } from "../../lib/families/index";
// @ts-expect-error the build script is plain JavaScript
import { buildOptions } from "../../lib/scripts/build.mjs";

type Bundled = { compileSource: typeof compileSource; compileNow: typeof compileNow };
let bundled: Bundled;

beforeAll(async () => {
  const esbuild = await import("esbuild");
  const out = mkdtempSync(path.join(tmpdir(), "fanbound-bundle-"));
  await esbuild.build(buildOptions({ entry: "tests/cli/fixtures/bundle-entry.ts" }, out));
  bundled = (await import(pathToFileURL(path.join(out, "entry.mjs")).href)) as Bundled;
  // The build takes a few seconds, and longer on a busy machine than the default 10 s a hook gets.
}, 60_000);

const cases = readdirSync("tests/lang/cases").filter((f) => f.endsWith(".fnb")).sort();
const examples = readdirSync("lib/lang/examples").filter((f) => f.endsWith(".fnb")).sort();

describe("bundled code against the sources", () => {
  it("gives every golden case of the language the same diagnostics and function", () => {
    expect(cases.length).toBeGreaterThan(30);
    for (const f of cases) {
      const text = readFileSync(path.join("tests/lang/cases", f), "utf8");
      const a = bundled.compileSource(text);
      const b = compileSource(text);
      expect({ f, diagnostics: a.diagnostics, spec: a.spec }).toEqual({ f, diagnostics: b.diagnostics, spec: b.spec });
    }
  });

  it("maps every demo design onto every built-in family to the same netlist and figures", () => {
    for (const f of examples) {
      const source = readFileSync(path.join("lib/lang/examples", f), "utf8");
      for (const family of BUILT_IN_FAMILIES) {
        const input = { source, family, exports: ["json" as const] };
        const a = bundled.compileNow(input).result!;
        const b = compileNow(input).result!;
        expect(a.exports.json, `${f} on ${family.id}`).toBe(b.exports.json);
        expect(a.stats, `${f} on ${family.id}`).toEqual(b.stats);
      }
    }
  });

  it("answers from the command's own bundle", () => {
    const file = "lib/lang/examples/paddle-driver.fnb";
    const out = execFileSync(process.execPath, ["lib/cli/run.mjs", "map", file, "--family", "ttl-std-5v"], { encoding: "utf8" });
    const want = compileNow({ source: readFileSync(file, "utf8"), family: BUILT_IN_FAMILIES.find((x) => x.id === "ttl-std-5v")!, exports: ["json"], unitName: "paddle-driver" });
    expect(JSON.parse(out)).toEqual(JSON.parse(want.result!.exports.json!));
  });
});
