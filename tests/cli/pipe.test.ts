import { describe, expect, it } from "vitest";
import { spawn } from "node:child_process";

/** Runs the CLI with its stdout on a pipe, as a script would, and collects every byte. */
function runPiped(args: string[], stdin: string): Promise<{ code: number | null; out: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["node_modules/tsx/dist/cli.mjs", "lib/cli/main.ts", ...args], {
      stdio: ["pipe", "pipe", "inherit"],
    });
    const chunks: Buffer[] = [];
    child.stdout.on("data", (c: Buffer) => chunks.push(c));
    child.on("error", reject);
    child.on("close", (code) => resolve({ code, out: Buffer.concat(chunks).toString("utf8") }));
    child.stdin.end(stdin);
  });
}

describe("the command line on a pipe", () => {
  it("writes an answer far larger than one pipe buffer (64 KiB) in full", async () => {
    const source = "inputs a, b, c, d, e, f, g, h, i, j, k, l\noutputs p\np = a ^ b ^ c ^ d ^ e ^ f ^ g ^ h ^ i ^ j ^ k ^ l\n";
    const { code, out } = await runPiped(["minimize", "-"], source);
    expect(code).toBe(0);
    expect(out.length).toBeGreaterThan(64 * 1024);
    const json = JSON.parse(out) as { outputs: Array<{ products: number; cubes: string[] }> };
    // Odd parity of n inputs has no two adjacent ON minterms, so its minimum SOP is all
    // 2^(n−1) minterms: 2048 for 12 inputs (textbook fact about parity; from memory).
    expect(json.outputs[0]!.products).toBe(2048);
    expect(json.outputs[0]!.cubes).toHaveLength(2048);
  });
});
