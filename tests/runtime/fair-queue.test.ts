/** The fair queue in front of the compile pool (round robin among callers; common practice, no source). */
import { describe, expect, it } from "vitest";
import { FairQueue, QueueFull } from "../../lib/runtime/fair-queue";

const tick = () => new Promise((r) => setTimeout(r, 0));

describe("FairQueue", () => {
  it("serves waiting callers in turn, not in arrival order", async () => {
    const q = new FairQueue(1, 1, 10);
    const served: string[] = [];
    const first = await q.acquire("a");
    // Each one served notes its caller and gives the slot back at once.
    const waits = ["a", "a", "a", "b", "c"].map((c) => q.acquire(c).then((release) => {
      served.push(c);
      release();
    }));
    first();
    await Promise.all(waits);
    expect(served).toEqual(["a", "b", "c", "a", "a"]);
  });

  it("never gives one caller more than its share of the slots", async () => {
    const q = new FairQueue(3, 2, 10);
    const r1 = await q.acquire("a");
    await q.acquire("a");
    let third = false;
    void q.acquire("a").then(() => { third = true; });
    await tick();
    expect(third).toBe(false);
    expect(q.load()).toEqual({ running: 2, waiting: 1 });
    await q.acquire("b");
    r1();
    await tick();
    expect(third).toBe(true);
  });

  it("refuses a caller with too many waiting, and lets a cancelled wait go", async () => {
    const q = new FairQueue(1, 1, 1);
    await q.acquire("a");
    const ctl = new AbortController();
    const waiting = q.acquire("a", ctl.signal);
    await expect(q.acquire("a")).rejects.toBeInstanceOf(QueueFull);
    ctl.abort(new Error("stopped"));
    await expect(waiting).rejects.toThrow("stopped");
    expect(q.load()).toEqual({ running: 1, waiting: 0 });
  });
});
