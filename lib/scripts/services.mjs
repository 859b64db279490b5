// Set-up shared by `npm start`, `npm test` and `npm run stop`. Only Node
// built-ins here: this file runs before the project's packages are installed.
import { spawnSync, spawn } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync, rmSync, chownSync, statSync, openSync } from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const dataDir = path.join(root, ".data");
export const pgDir = path.join(dataDir, "pg");
/**
 * Shifts every port the scripts use (PostgreSQL, mail, web) by this much, so
 * that two checkouts on one machine can run their services side by side.
 * Default 0.
 */
export const PORT_OFFSET = Number(process.env.FANBOUND_PORT_OFFSET ?? 0);
export const PG_PORT = Number(process.env.FANBOUND_PG_PORT ?? 54329 + PORT_OFFSET);
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

/**
 * Each profile's database, ports and mail folder. The mail catcher shows what
 * it caught on its own loopback port (mailViewPort: the SMTP port + 100), never
 * through the app.
 */
export const profiles = {
  dev: {
    database: "fanbound", smtpPort: 2525 + PORT_OFFSET, mailViewPort: 2625 + PORT_OFFSET, webPort: 3000 + PORT_OFFSET,
    mailDir: path.join(dataDir, "mail"),
  },
  test: {
    database: "fanbound_test", smtpPort: 2526 + PORT_OFFSET, mailViewPort: 2626 + PORT_OFFSET, webPort: 3100 + PORT_OFFSET,
    mailDir: path.join(dataDir, "mail-test"),
  },
};

export function log(msg) {
  process.stdout.write(`[fanbound] ${msg}\n`);
}

export function fail(msg) {
  process.stderr.write(`[fanbound] ${msg}\n`);
  process.exit(1);
}

/** Runs a command, inheriting output; exits the script when it fails. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: "inherit", cwd: root, ...opts });
  if (r.error) fail(`could not run ${cmd}: ${r.error.message}`);
  if (r.status !== 0 && !opts.allowFail) fail(`${cmd} ${args.join(" ")} exited with ${r.status}`);
  return r.status ?? 1;
}

function capture(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { encoding: "utf8", cwd: root, ...opts });
  return { status: r.status ?? 1, out: (r.stdout ?? "") + (r.stderr ?? "") };
}

let aptUpdated = false;
/** Installs Debian packages when running as root; otherwise says what to install. */
export function aptInstall(packages, why, { optional = false } = {}) {
  if (!isRoot && optional) return false;
  if (!isRoot) fail(`${why}: install the Debian packages ${packages.join(" ")} (as root: apt-get install -y ${packages.join(" ")})`);
  log(`installing ${packages.join(", ")} with apt-get (${why})`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  if (!aptUpdated) {
    run("apt-get", ["update", "-q"], { env, allowFail: true });
    aptUpdated = true;
  }
  const status = run("apt-get", ["install", "-y", "-q", "--no-install-recommends", ...packages], { env, allowFail: optional });
  return status === 0;
}

export function hasCommand(cmd) {
  return capture("sh", ["-c", `command -v ${cmd}`]).status === 0;
}

/** npm ci when node_modules is missing or older than the lock file. */
export function ensureDependencies() {
  const marker = path.join(root, "node_modules", ".package-lock.json");
  const lock = path.join(root, "package-lock.json");
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  log("installing npm dependencies (npm ci)");
  run("npm", ["ci", "--no-audit", "--no-fund"]);
}

export function portFree(port, host = "127.0.0.1") {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once("error", () => resolve(false));
    srv.listen(port, host, () => srv.close(() => resolve(true)));
  });
}

export function portOpen(port, host = "127.0.0.1") {
  return new Promise((resolve) => {
    const s = net.connect(port, host);
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

function pgBin() {
  for (const v of ["17", "16", "15"]) {
    const dir = `/usr/lib/postgresql/${v}/bin`;
    if (existsSync(path.join(dir, "initdb"))) return dir;
  }
  return null;
}

/** Runs a PostgreSQL server binary, as the postgres user when we are root (initdb refuses root). */
function pgRun(bin, args, opts = {}) {
  const exe = path.join(pgBin(), bin);
  if (isRoot) return run("runuser", ["-u", "postgres", "--", exe, ...args], opts);
  return run(exe, args, opts);
}

export function externalDatabaseUrl() {
  return process.env.DATABASE_URL || null;
}

/** The project's own server as its superuser (set-up only: roles, databases). */
export function adminUrl(database = "postgres") {
  return `postgres://postgres@127.0.0.1:${PG_PORT}/${database}`;
}

/**
 * Where the app connects: DATABASE_URL when given, else the app role
 * (fanbound_app, no superuser, owns nothing) on the project's own server.
 */
export function databaseUrl(database) {
  return externalDatabaseUrl() ?? `postgres://fanbound_app@127.0.0.1:${PG_PORT}/${database}`;
}

/**
 * Where migrations run: DATABASE_OWNER_URL when given, else DATABASE_URL when
 * given (one role for both), else the owner role (fanbound_owner) of the
 * project's own server.
 */
export function ownerDatabaseUrl(database) {
  return process.env.DATABASE_OWNER_URL || externalDatabaseUrl() || `postgres://fanbound_owner@127.0.0.1:${PG_PORT}/${database}`;
}

/**
 * Starts the project's own PostgreSQL cluster in .data/pg on 127.0.0.1:PG_PORT,
 * creating it first when needed. Does nothing when DATABASE_URL is set.
 */
export async function ensurePostgres() {
  if (externalDatabaseUrl()) {
    log("DATABASE_URL is set: using that server, starting none");
    return;
  }
  if (!pgBin()) aptInstall(["postgresql"], "the PostgreSQL server binaries are missing");
  mkdirSync(dataDir, { recursive: true });
  if (isRoot) {
    // The postgres user must be able to reach the data folder through every parent.
    for (let d = dataDir; d !== path.dirname(d); d = path.dirname(d)) {
      const mode = statSync(d).mode;
      if ((mode & 0o001) === 0) spawnSync("chmod", ["o+x", d]);
    }
  }
  if (!existsSync(path.join(pgDir, "PG_VERSION"))) {
    log(`creating the database cluster in ${path.relative(root, pgDir)}`);
    rmSync(pgDir, { recursive: true, force: true });
    mkdirSync(pgDir, { recursive: true });
    if (isRoot) spawnSync("chown", ["-R", "postgres:postgres", pgDir]);
    pgRun("initdb", ["-D", pgDir, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"], {
      stdio: ["ignore", "ignore", "inherit"],
    });
  }
  if (pgRunning()) return;
  if (!(await portFree(PG_PORT))) {
    fail(`port ${PG_PORT} on 127.0.0.1 is taken by another program; stop it, or set FANBOUND_PG_PORT to a free port`);
  }
  log(`starting PostgreSQL on 127.0.0.1:${PG_PORT}`);
  const logFile = path.join(pgDir, "server.log");
  pgRun("pg_ctl", [
    "-D", pgDir, "-l", logFile, "-w", "-t", "60",
    "-o", `-c listen_addresses=127.0.0.1 -c port=${PG_PORT} -c unix_socket_directories=${pgDir}`,
    "start",
  ], { stdio: ["ignore", "ignore", "inherit"] });
}

function pgRunning() {
  if (!pgBin() || !existsSync(path.join(pgDir, "PG_VERSION"))) return false;
  const exe = path.join(pgBin(), "pg_ctl");
  const r = isRoot
    ? capture("runuser", ["-u", "postgres", "--", exe, "-D", pgDir, "status"])
    : capture(exe, ["-D", pgDir, "status"]);
  return r.status === 0;
}

export function stopPostgres() {
  if (externalDatabaseUrl() || !pgRunning()) return;
  log("stopping PostgreSQL");
  pgRun("pg_ctl", ["-D", pgDir, "-m", "fast", "-w", "stop"], { stdio: ["ignore", "ignore", "inherit"] });
}

/**
 * Creates the owner and app roles and the database when missing, and sets the
 * app role's grants (lib/db/roles.mjs). Needs the pg package, so call after
 * ensureDependencies. Does nothing when DATABASE_URL is set.
 */
export async function ensureDatabase(database) {
  if (externalDatabaseUrl()) return;
  const { prepareDatabase } = await import("../db/roles.mjs");
  const { created, adopted } = await prepareDatabase(adminUrl(), database);
  if (created) log(`created database ${database} (owner fanbound_owner, app role fanbound_app)`);
  if (adopted) log(`handed ${adopted} objects of ${database} to fanbound_owner and granted fanbound_app its rights`);
}

function pidFile(name) {
  return path.join(dataDir, `${name}.pid`);
}

function alive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export function readPid(name) {
  try {
    const pid = Number(readFileSync(pidFile(name), "utf8"));
    return pid && alive(pid) ? pid : null;
  } catch {
    return null;
  }
}

/** Starts a detached helper process with its pid in .data/NAME.pid, unless it already runs. */
export async function ensureDaemon(name, args, { port, env = {} }) {
  if (readPid(name)) return;
  if (!(await portFree(port))) {
    fail(`port ${port} on 127.0.0.1 is taken by another program (needed for ${name}); stop it and try again`);
  }
  mkdirSync(dataDir, { recursive: true });
  const out = openSync(path.join(dataDir, `${name}.log`), "a");
  const child = spawn(process.execPath, args, {
    cwd: root,
    detached: true,
    stdio: ["ignore", out, out],
    env: { ...process.env, ...env },
  });
  child.unref();
  writeFileSync(pidFile(name), String(child.pid));
  for (let i = 0; i < 100; i++) {
    if (await portOpen(port)) return;
    if (!alive(child.pid)) fail(`${name} stopped at start; see .data/${name}.log`);
    await new Promise((r) => setTimeout(r, 100));
  }
  fail(`${name} did not open port ${port}; see .data/${name}.log`);
}

/** Starts a detached process that opens no port (a job worker), with its pid in .data/NAME.pid, unless it already runs. */
export function ensureProcess(name, args, env = {}) {
  if (readPid(name)) return;
  mkdirSync(dataDir, { recursive: true });
  const out = openSync(path.join(dataDir, `${name}.log`), "a");
  const child = spawn(process.execPath, args, { cwd: root, detached: true, stdio: ["ignore", out, out], env: { ...process.env, ...env } });
  child.unref();
  writeFileSync(pidFile(name), String(child.pid));
}

export function stopDaemon(name) {
  const pid = readPid(name);
  if (!pid) return false;
  try {
    process.kill(-pid, "SIGTERM");
  } catch {
    try {
      process.kill(pid, "SIGTERM");
    } catch {
      /* already gone */
    }
  }
  rmSync(pidFile(name), { force: true });
  log(`stopped ${name} (pid ${pid})`);
  return true;
}

/**
 * The local mail catcher for a profile: SMTP on loopback, messages kept as
 * files, and a read-only page of them on its own loopback port.
 */
export async function ensureMailCatcher(profile) {
  const name = `mail-${profile.smtpPort}`;
  await ensureDaemon(name, [path.join(root, "lib/scripts/mail-catcher.mjs")], {
    port: profile.smtpPort,
    env: { MAIL_PORT: String(profile.smtpPort), MAIL_VIEW_PORT: String(profile.mailViewPort), MAIL_DIR: profile.mailDir },
  });
  // A catcher started before it served its page is replaced by one that does.
  if (!(await portOpen(profile.mailViewPort))) {
    stopDaemon(name);
    await new Promise((r) => setTimeout(r, 300));
    await ensureDaemon(name, [path.join(root, "lib/scripts/mail-catcher.mjs")], {
      port: profile.smtpPort,
      env: { MAIL_PORT: String(profile.smtpPort), MAIL_VIEW_PORT: String(profile.mailViewPort), MAIL_DIR: profile.mailDir },
    });
  }
}

/** The address of the catcher's page of captured mail. */
export function mailViewUrl(profile) {
  return `http://127.0.0.1:${profile.mailViewPort}/`;
}

/**
 * Environment for the app, the seed and the tests of one profile: the app's
 * database role, never the owner's. The captured mail is not in it.
 */
export function appEnv(profile, extra = {}) {
  const env = {
    ...process.env,
    DATABASE_URL: databaseUrl(profile.database),
    SMTP_URL: `smtp://127.0.0.1:${profile.smtpPort}`,
    NEXTAUTH_URL: `http://127.0.0.1:${profile.webPort}`,
    NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? localSecret(),
    // glibc gives each thread that allocates its own malloc arena (64 MiB reserved apiece) and seldom hands
    // them back; the server's worker threads kept its resident memory near 470 MiB after a load, 345 MiB with
    // two arenas (glibc manual, "Memory Allocation Tunables": glibc.malloc.arena_max / MALLOC_ARENA_MAX).
    MALLOC_ARENA_MAX: process.env.MALLOC_ARENA_MAX ?? "2",
    ...extra,
  };
  delete env.DATABASE_OWNER_URL;
  delete env.MAIL_DIR;
  return env;
}

/** Environment for the migrations: the owner role's connection. */
export function migrationEnv(profile) {
  return { ...appEnv(profile), DATABASE_URL: ownerDatabaseUrl(profile.database) };
}

/** A secret made once per checkout and kept in .data, so sessions survive restarts. */
function localSecret() {
  const file = path.join(dataDir, "auth-secret");
  if (!existsSync(file)) {
    mkdirSync(dataDir, { recursive: true });
    const bytes = new Uint8Array(32);
    globalThis.crypto.getRandomValues(bytes);
    writeFileSync(file, Buffer.from(bytes).toString("hex"), { mode: 0o600 });
  }
  return readFileSync(file, "utf8").trim();
}

export { isRoot, chownSync };
