// Outside tools for the exporter tests: Icarus Verilog and GHDL from Debian.
// Installs a missing tool with apt-get when running as root (CI is root);
// otherwise the caller skips with a loud message.
import { spawnSync } from "node:child_process";

const has = (cmd: string) => spawnSync("sh", ["-c", `command -v ${cmd}`], { encoding: "utf8" }).status === 0;

export function ensureTool(cmd: string, pkg: string): boolean {
  if (has(cmd)) return true;
  if (process.getuid?.() === 0) {
    let r = spawnSync("apt-get", ["install", "-y", "--no-install-recommends", pkg], { stdio: "ignore", env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
    if (r.status !== 0) {
      spawnSync("apt-get", ["update"], { stdio: "ignore" });
      r = spawnSync("apt-get", ["install", "-y", "--no-install-recommends", pkg], { stdio: "ignore", env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
    }
    if (has(cmd)) return true;
  }
  console.warn(`\n*** ${cmd} (Debian package ${pkg}) is not available and could not be installed: these HDL checks are SKIPPED ***\n`);
  return false;
}

export function run(cmd: string, args: string[], cwd: string): { ok: boolean; out: string } {
  const r = spawnSync(cmd, args, { cwd, encoding: "utf8" });
  return { ok: r.status === 0, out: `${r.stdout ?? ""}${r.stderr ?? ""}` };
}
