// Builds what runs outside Next: the compile pool's worker, the CLI and the
// job worker, each one ES module in .build/ made by esbuild from the
// TypeScript sources, so nothing is transpiled at run time. Small pure
// packages (the parser generator, zod, the CSV parser) are bundled and
// minified with them: a command then starts from a few files instead of
// hundreds (a `check` in a quarter of the time); packages with native parts,
// database drivers and large ones loaded only by some commands stay in
// node_modules. `npm start` and `npm test` build them; the CLI's launcher
// (lib/cli/run.mjs) rebuilds when a source under lib/ is newer than its bundle.
import { existsSync, readdirSync, renameSync, rmSync, statSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const outDir = path.join(root, ".build");

/** Bundle name → entry source. */
export const ENTRIES = {
  "pipeline-worker": "lib/runtime/pipeline-worker.ts",
  cli: "lib/cli/main.ts",
  seed: "lib/db/seed.ts",
  "jobs-worker": "lib/runtime/jobs-worker.ts",

};

function newestSource(dir = path.join(root, "lib"), newest = 0) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) newest = newestSource(p, newest);
    else if (/\.(ts|mjs|json)$/.test(e.name)) newest = Math.max(newest, statSync(p).mtimeMs);
  }
  return newest;
}

/** True when every named bundle exists and is newer than every source under lib/ and models/. */
export function upToDate(names) {
  const files = names.map((n) => path.join(outDir, `${n}.mjs`));
  if (!files.every(existsSync)) return false;
  const built = Math.min(...files.map((f) => statSync(f).mtimeMs));
  return built >= Math.max(newestSource(), newestSource(path.join(root, "models")));
}

/** Packages left in node_modules (imported at run time): drivers, native parts, and large ones few commands need. */
export const EXTERNAL = ["pg", "pg-hstore", "sequelize", "pg-boss", "piscina", "nodemailer", "highs", "esbuild", "logic-solver", "elkjs",
  "next", "next-auth", "rate-limiter-flexible", "bcryptjs", "@zxcvbn-ts/core", "@zxcvbn-ts/language-common"];

/** The esbuild options every bundle is made with (the tests build with them too). */
export function buildOptions(entryPoints, outdir) {
  return {
    absWorkingDir: root,
    entryPoints,
    outdir,
    outExtension: { ".js": ".mjs" },
    chunkNames: "chunks/[name]-[hash]",
    bundle: true,
    splitting: true,
    format: "esm",
    platform: "node",
    target: "node20",
    external: EXTERNAL,
    minify: true,
    sourcemap: "linked",
    logLevel: "warning",
    // "server-only" guards modules against the browser; these bundles are the server.
    plugins: [{
      name: "server-only",
      setup(b) {
        b.onResolve({ filter: /^server-only$/ }, () => ({ path: "server-only", namespace: "empty" }));
        b.onLoad({ filter: /.*/, namespace: "empty" }, () => ({ contents: "", loader: "js" }));
      },
    }],
  };
}

/** Builds every bundle (they share chunks, so they are built together), replacing what .build held. */
export async function build() {
  const names = Object.keys(ENTRIES);
  const esbuild = await import("esbuild");
  // Built beside, then swapped in, so a process starting meanwhile finds the old bundles or the new.
  const fresh = `${outDir}.${process.pid}`;
  rmSync(fresh, { recursive: true, force: true });
  await esbuild.build(buildOptions(Object.fromEntries(names.map((n) => [n, ENTRIES[n]])), fresh));
  const old = `${outDir}.old.${process.pid}`;
  try {
    if (existsSync(outDir)) renameSync(outDir, old);
    renameSync(fresh, outDir);
  } catch (e) {
    // Another process swapped its own build in at the same moment: theirs is as fresh as ours.
    if (!existsSync(outDir)) throw e;
  }
  rmSync(old, { recursive: true, force: true });
  rmSync(fresh, { recursive: true, force: true });
}

/** Builds the bundles when any of them is missing or older than the sources. */
export async function ensureBuilt() {
  if (!upToDate(Object.keys(ENTRIES))) await build();
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  if (process.argv.includes("--if-stale") && upToDate(Object.keys(ENTRIES))) process.exit(0);
  await build();
  process.stdout.write(`[fanbound] built ${Object.keys(ENTRIES).map((n) => `.build/${n}.mjs`).join(", ")}\n`);
}
