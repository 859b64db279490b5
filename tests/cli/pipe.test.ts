import { describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

/**
 * Runs the CLI behind a shell pipe (`… | cat`), as a script would: a real
 * pipe, not the socket pair Node gives a child, is where a premature exit cut
 * answers short. Returns the CLI's exit status (via PIPESTATUS-free `set -o pipefail`).
 */
function runPiped(args: string[], source: string): Promise<{ code: number | null; out: string }> {
  const dir = mkdtempSync(path.join(tmpdir(), "fanbound-cli-"));
  const file = path.join(dir, "design.fnb");
  writeFileSync(file, source);
  const cmd = `set -o pipefail; "${process.execPath}" lib/cli/run.mjs ${args.join(" ")} "${file}" | cat`;
  return new Promise((resolve, reject) => {
    const child = spawn("bash", ["-c", cmd], { stdio: ["ignore", "pipe", "inherit"] });
    const chunks: Buffer[] = [];
    child.stdout.on("data", (c: Buffer) => chunks.push(c));
    child.on("error", reject);
    child.on("close", (code) => resolve({ code, out: Buffer.concat(chunks).toString("utf8") }));
  });
}

describe("the command line on a pipe", () => {
  it("writes an answer far larger than one pipe buffer (64 KiB) in full", async () => {
    const source = "inputs a, b, c, d, e, f, g, h, i, j, k, l\noutputs p\np = a ^ b ^ c ^ d ^ e ^ f ^ g ^ h ^ i ^ j ^ k ^ l\n";
    const { code, out } = await runPiped(["minimize"], source);
    expect(code).toBe(0);
    expect(out.length).toBeGreaterThan(64 * 1024);
    const json = JSON.parse(out) as { outputs: Array<{ products: number; cubes: string[] }> };
    // Odd parity of n inputs has no two adjacent ON minterms, so its minimum SOP is all
    // 2^(n−1) minterms: 2048 for 12 inputs (textbook fact about parity; from memory).
    expect(json.outputs[0]!.products).toBe(2048);
    expect(json.outputs[0]!.cubes).toHaveLength(2048);
  });
});
