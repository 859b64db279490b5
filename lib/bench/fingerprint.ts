/**
 * A short digest of a minimization result (every output's terms in order,
 * cost, bound, exactness, route, prime count), so that two runs can be
 * compared case by case: equal digests mean equal results.
 */
import type { MinimizeResult } from "../minimize";

/** FNV-1a over the result's fields, as 8 hexadecimal digits. */
export function fingerprint(r: MinimizeResult): string {
  let h = 0x811c9dc5;
  const mix = (x: number) => {
    for (let k = 0; k < 4; k++) {
      h ^= (x >>> (8 * k)) & 255;
      h = Math.imul(h, 16777619);
    }
  };
  mix(r.outputs.length);
  for (const o of r.outputs) {
    mix(o.cubes.length);
    for (const c of o.cubes) {
      mix(c.value);
      mix(c.mask);
    }
    mix(o.exact ? 1 : 0);
    mix(o.lowerBound);
  }
  mix(r.cost);
  mix(r.lowerBound);
  mix(r.exact ? 1 : 0);
  mix(r.route === "exact" ? 1 : 2);
  mix(r.primes);
  return (h >>> 0).toString(16).padStart(8, "0");
}

/**
 * Replaces Date.now by a clock that advances `stepMs` at every reading, so
 * that the runs cut short by a time limit stop after the same work each time
 * and their results can be compared too. Returns a function that restores
 * the real clock.
 */
export function installCountingClock(stepMs: number): () => void {
  const real = Date.now;
  let t = real();
  Date.now = () => (t += stepMs);
  return () => {
    Date.now = real;
  };
}
