import { describe, expect, it } from "vitest";
import { minterm } from "../../lib/logic";
import { LimitError } from "../../lib/minimize";
import { minimizeInWorker } from "../../lib/minimize/worker";
import { randomSpec } from "./helpers";

describe("worker runner", () => {
  it("returns the same minimum as in-process", async () => {
    // Source: Wikipedia, "Quine–McCluskey algorithm" worked example: 3 products.
    const spec = {
      inputs: ["a", "b", "c", "d"],
      outputs: [{ name: "f", on: [4, 8, 10, 11, 12, 15].map((m) => minterm(m, 4)), dc: [9, 14].map((m) => minterm(m, 4)) }],
    };
    const r = await minimizeInWorker(spec);
    expect(r.outputs[0]!.products).toBe(3);
    expect(r.outputs[0]!.literals).toBe(7);
  });

  it("abort terminates the run with a LimitError", async () => {
    // A 16-input random function runs for seconds; the abort comes first.
    const spec = randomSpec(16, 1, 5);
    const ac = new AbortController();
    const p = minimizeInWorker(spec, { timeLimitMs: 60_000 }, { signal: ac.signal });
    setTimeout(() => ac.abort(), 300);
    const err = await p.catch((e: unknown) => e);
    expect(err).toBeInstanceOf(LimitError);
    expect((err as LimitError).limit).toBe("aborted");
  });

  it("a budget overrun rejects naming the budget", async () => {
    const spec = randomSpec(16, 1, 6);
    const err = await minimizeInWorker(spec, { timeLimitMs: 60_000 }, { budgetMs: 400 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(LimitError);
    expect((err as LimitError).limit).toBe("budgetMs");
    expect((err as LimitError).message).toContain("400 ms");
  });
});
