// `npm start`: install what is missing, start PostgreSQL and the mail catcher
// on loopback, migrate, seed the demo, build, and serve on 127.0.0.1:3000.
import { spawn } from "node:child_process";
import { writeFileSync, rmSync } from "node:fs";
import path from "node:path";
import {
  root, dataDir, profiles, log, fail, run, ensureDependencies, ensurePostgres, ensureDatabase,
  ensureMailCatcher, appEnv, migrationEnv, mailViewUrl, portFree, readPid, ensureProcess, stopDaemon,
} from "./services.mjs";

const profile = profiles.dev;
ensureDependencies();
await ensurePostgres();
await ensureDatabase(profile.database);
await ensureMailCatcher(profile);
const env = appEnv(profile, { NODE_ENV: "production", FANBOUND_DEMO: "1" });
run(process.execPath, ["lib/scripts/build.mjs"], { env });
// Migrations run as the owner role; the seed and the server as the app role.
run(process.execPath, ["lib/db/migrate.mjs", "up"], { env: { ...migrationEnv(profile), NODE_ENV: "production" } });
run(process.execPath, [".build/seed.mjs"], { env });

if (readPid("web")) fail("Fanbound is already being served (see .data/web.pid); run `npm run stop` first");
if (!(await portFree(profile.webPort))) {
  fail(`port ${profile.webPort} on 127.0.0.1 is taken by another program; stop it and run npm start again`);
}
log("building the app (next build)");
run(process.execPath, ["node_modules/next/dist/bin/next", "build"], { env: { ...env, NEXT_TELEMETRY_DISABLED: "1" } });

// One job worker beside the server, for compiles run to the end (more: `npm run worker`, on any machine).
stopDaemon("jobs-worker");
ensureProcess("jobs-worker", [".build/jobs-worker.mjs"], env);

const server = spawn(
  process.execPath,
  ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(profile.webPort)],
  { cwd: root, stdio: ["ignore", "inherit", "inherit"], env: { ...env, NEXT_TELEMETRY_DISABLED: "1" } },
);
const pidFile = path.join(dataDir, "web.pid");
writeFileSync(pidFile, String(server.pid));
const { DEMO_PASSWORD, DEMO_ACCOUNTS } = await import("./demo.mjs");
log("");
log(`Fanbound is served at http://127.0.0.1:${profile.webPort}`);
log(`demo sign-ins (password ${DEMO_PASSWORD}):`);
for (const [role, email] of DEMO_ACCOUNTS) log(`  ${role.padEnd(9)} ${email}`);
log(`captured mail (sign-in links, resets, invitations; this machine only): ${mailViewUrl(profile)}`);
log("one job worker runs beside it (.data/jobs-worker.log); start more with `npm run worker`");
log("stop with Ctrl+C, or `npm run stop` to stop the database, the mail catcher and the job worker too");
const stop = () => {
  server.kill("SIGTERM");
  stopDaemon("jobs-worker");
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
server.on("exit", (code) => {
  rmSync(pidFile, { force: true });
  process.exit(code ?? 0);
});
