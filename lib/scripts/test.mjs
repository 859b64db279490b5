// `npm test`: the same set-up as `npm start` against a fresh test database,
// then type-check, lint, unit and integration tests, and browser tests in
// Debian's chromium against a production build. Exits non-zero on any failure.
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, rmSync, mkdirSync } from "node:fs";
import path from "node:path";
import {
  root, dataDir, profiles, log, run, ensureDependencies, ensurePostgres, ensureDatabase,
  ensureMailCatcher, appEnv, migrationEnv, aptInstall, hasCommand, ensureDaemon, stopDaemon, externalDatabaseUrl,
  adminUrl, ownerDatabaseUrl, mailViewUrl,
} from "./services.mjs";

const profile = profiles.test;
ensureDependencies();
if (!existsSync("/usr/bin/chromium")) aptInstall(["chromium"], "browser tests drive Debian's chromium");
if (!hasCommand("iverilog")) aptInstall(["iverilog"], "the exported Verilog is simulated with Icarus Verilog");
if (!hasCommand("ghdl") && !aptInstall(["ghdl"], "the exported VHDL is analysed with GHDL", { optional: true })) {
  log("GHDL did not install; the VHDL analysis test will say so and skip");
}
await ensurePostgres();
await recreateTestDatabase();
await ensureMailCatcher(profile);

const distDir = ".next-test";
const env = appEnv(profile, { FANBOUND_DIST_DIR: distDir, NEXT_TELEMETRY_DISABLED: "1" });
run(process.execPath, ["lib/scripts/build.mjs"], { env });
// Migrations run as the owner role; the seed and the server as the app role.
run(process.execPath, ["lib/db/migrate.mjs", "up"], { env: { ...migrationEnv(profile), FANBOUND_DIST_DIR: distDir } });
run(process.execPath, [".build/seed.mjs"], { env });

const failures = [];
const counts = { passed: 0, failed: 0, skipped: 0 };
// What only the tests get: the captured mail (files and the catcher's page) and
// the owner role's connection (to check what the app role may not do).
const testEnv = {
  MAIL_DIR: profile.mailDir,
  FANBOUND_MAIL_VIEW_URL: mailViewUrl(profile),
  DATABASE_OWNER_URL: ownerDatabaseUrl(profile.database),
};
function step(name, cmd, args, extraEnv = {}) {
  log(`— ${name}`);
  const r = spawnSync(cmd, args, { stdio: "inherit", cwd: root, env: { ...env, ...extraEnv } });
  if (r.status !== 0) failures.push(name);
  return r.status === 0;
}
function vitest(name, project, extraEnv = {}) {
  const report = path.join(dataDir, `vitest-${project}.json`);
  rmSync(report, { force: true });
  step(name, process.execPath, [
    "node_modules/vitest/vitest.mjs", "run", "--project", project,
    "--reporter=default", "--reporter=json", `--outputFile.json=${report}`,
  ], extraEnv);
  if (existsSync(report)) {
    const r = JSON.parse(readFileSync(report, "utf8"));
    counts.passed += r.numPassedTests ?? 0;
    counts.failed += r.numFailedTests ?? 0;
    counts.skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  }
}

step("type-check (tsc)", process.execPath, ["node_modules/typescript/bin/tsc", "--noEmit", "-p", "tsconfig.json"]);
step("lint (eslint)", process.execPath, ["node_modules/eslint/bin/eslint.js", "--max-warnings=0", "."]);
vitest("unit tests", "unit");
vitest("integration tests (PostgreSQL)", "integration", testEnv);

log("— production build for the browser tests");
rmSync(path.join(root, distDir), { recursive: true, force: true });
if (step("next build", process.execPath, ["node_modules/next/dist/bin/next", "build"], { NODE_ENV: "production" })) {
  // Two servers of the same build on two ports: the tests check that they share
  // what must be shared (rate limits live in PostgreSQL, not in a process).
  const secondPort = profile.webPort + 5;
  for (const [name, port] of [["web-test", profile.webPort], ["web-test-2", secondPort]]) {
    stopDaemon(name);
    await ensureDaemon(name, [
      "node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(port),
    ], { port, env: { ...env, NODE_ENV: "production" } });
  }
  mkdirSync(path.join(root, "test-results"), { recursive: true });
  await clearRateLimits();
  vitest("browser tests (chromium)", "browser", {
    ...testEnv,
    FANBOUND_BASE_URL: `http://127.0.0.1:${profile.webPort}`,
    FANBOUND_SECOND_BASE_URL: `http://127.0.0.1:${secondPort}`,
  });
  stopDaemon("web-test");
  stopDaemon("web-test-2");
}

log("");
if (failures.length) log(`failed steps: ${failures.join(", ")}`);
console.log(`tests: ${counts.passed} passed, ${counts.failed} failed, ${counts.skipped} skipped`);
process.exit(failures.length ? 1 : 0);

/** A clean test database each run, so a run never depends on the one before. */
async function recreateTestDatabase() {
  if (externalDatabaseUrl()) {
    log("DATABASE_URL is set: the tests use that database as it is");
    return;
  }
  const { default: pg } = await import("pg");
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    await client.query(`DROP DATABASE IF EXISTS "${profile.database}" WITH (FORCE)`);
  } finally {
    await client.end();
  }
  await ensureDatabase(profile.database);
}

/** The browser tests start with no rate-limit counters left over from the integration tests. */
async function clearRateLimits() {
  const { default: pg } = await import("pg");
  const client = new pg.Client({ connectionString: env.DATABASE_URL });
  await client.connect();
  try {
    await client.query("DELETE FROM rate_limits");
  } finally {
    await client.end();
  }
}
