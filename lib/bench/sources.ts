/**
 * Design sources of wide, structured functions in the equation language, for
 * the benchmarks that drive the app (browser, load). Each is a textbook
 * construction written the way a designer would type it.
 */

/** An n-bit magnitude comparator (2n inputs): outputs gt, eq, lt of A against B, most significant bit first. */
export function comparatorSource(n: number): string {
  const a = Array.from({ length: n }, (_, i) => `a${n - 1 - i}`);
  const b = Array.from({ length: n }, (_, i) => `b${n - 1 - i}`);
  const lines = [`// ${n}-bit magnitude comparator: A > B, A = B, A < B`, `inputs ${[...a, ...b].join(", ")}`, "outputs gt, eq, lt"];
  for (let i = 0; i < n; i++) lines.push(`let e${i} = (a${i} ^ b${i})'`);
  let gt = "a0 * b0'";
  let lt = "a0' * b0";
  for (let i = 1; i < n; i++) {
    gt = `a${i} * b${i}' + e${i} * (${gt})`;
    lt = `a${i}' * b${i} + e${i} * (${lt})`;
  }
  lines.push(`gt = ${gt}`, `lt = ${lt}`, `eq = ${Array.from({ length: n }, (_, i) => `e${i}`).join(" * ")}`);
  return lines.join("\n") + "\n";
}

/** Odd parity of n inputs: p = x0 ^ x1 ^ … */
export function paritySource(n: number): string {
  const x = Array.from({ length: n }, (_, i) => `x${i}`);
  return `// parity of ${n} inputs\ninputs ${x.join(", ")}\noutputs p\np = ${x.join(" ^ ")}\n`;
}
