/**
 * Slots for heavy work shared fairly among callers. At most `slots` runs at
 * once; one caller holds at most `perCaller` of them, so one caller's burst
 * never shuts the others out; waiting callers are served in turn (round
 * robin), not in arrival order; and a caller may keep at most `queuePerCaller`
 * runs waiting, beyond which the request is refused (the caller retries later).
 */
export class QueueFull extends Error {
  override name = "QueueFull";
}

interface Waiter {
  go: () => void;
  fail: (e: unknown) => void;
}

export class FairQueue {
  private running = 0;
  private readonly byCaller = new Map<string, { running: number; waiting: Waiter[] }>();
  /** Callers with someone waiting, in the order they will be served. */
  private turn: string[] = [];

  constructor(
    readonly slots: number,
    readonly perCaller: number,
    readonly queuePerCaller: number,
  ) {}

  /** Waits for a slot; resolves with its release function. Rejects with QueueFull, or with the signal's reason when it aborts first. */
  acquire(caller: string, signal?: AbortSignal): Promise<() => void> {
    if (signal?.aborted) return Promise.reject(signal.reason);
    const c = this.entry(caller);
    if (c.waiting.length === 0 && this.running < this.slots && c.running < this.perCaller) {
      this.take(c);
      return Promise.resolve(this.releaser(caller));
    }
    if (c.waiting.length >= this.queuePerCaller) return Promise.reject(new QueueFull(`${c.waiting.length} runs of this caller are waiting already`));
    return new Promise((resolve, reject) => {
      const onAbort = () => {
        c.waiting.splice(c.waiting.indexOf(w), 1);
        this.tidy(caller);
        reject(signal!.reason);
      };
      const w: Waiter = {
        go: () => {
          signal?.removeEventListener("abort", onAbort);
          resolve(this.releaser(caller));
        },
        fail: reject,
      };
      signal?.addEventListener("abort", onAbort, { once: true });
      c.waiting.push(w);
      if (!this.turn.includes(caller)) this.turn.push(caller);
    });
  }

  /** Runs now and waiting, over all callers. */
  load(): { running: number; waiting: number } {
    let waiting = 0;
    for (const c of this.byCaller.values()) waiting += c.waiting.length;
    return { running: this.running, waiting };
  }

  private entry(caller: string) {
    let c = this.byCaller.get(caller);
    if (!c) this.byCaller.set(caller, (c = { running: 0, waiting: [] }));
    return c;
  }

  private take(c: { running: number }) {
    c.running++;
    this.running++;
  }

  private releaser(caller: string): () => void {
    let done = false;
    return () => {
      if (done) return;
      done = true;
      const c = this.byCaller.get(caller)!;
      c.running--;
      this.running--;
      this.tidy(caller);
      this.dispatch();
    };
  }

  /** Gives free slots to waiting callers in turn. */
  private dispatch() {
    let tried = 0;
    while (this.running < this.slots && this.turn.length && tried < this.turn.length) {
      const caller = this.turn.shift()!;
      const c = this.byCaller.get(caller)!;
      if (c.running < this.perCaller && c.waiting.length) {
        this.take(c);
        c.waiting.shift()!.go();
        tried = 0;
      } else tried++;
      if (c.waiting.length) this.turn.push(caller);
      else this.tidy(caller);
    }
  }

  private tidy(caller: string) {
    const c = this.byCaller.get(caller);
    if (!c) return;
    if (!c.waiting.length) this.turn = this.turn.filter((x) => x !== caller);
    if (!c.running && !c.waiting.length) this.byCaller.delete(caller);
  }
}
