/**
 * The compile pool of a server process: warm worker threads (piscina) that
 * run the pipeline's stages off the request thread, each run under one time
 * budget and one cancel, and a fair queue in front so that no caller's burst
 * holds every thread. A run over its budget, cancelled, or out of memory is
 * stopped by ending its thread; the pool starts a fresh one.
 */
import path from "node:path";
import { MessageChannel } from "node:worker_threads";
import { availableParallelism } from "node:os";
import { Piscina } from "piscina";
import { cancelledError, type Executor, type PipelineError, type Progress, type StageOutcome } from "../pipeline/index";
import { FairQueue, QueueFull } from "./fair-queue";

export { QueueFull };

export interface PoolOptions {
  /** The built worker (default .build/pipeline-worker.mjs under the working directory). */
  file?: string;
  /** Threads; default the machine's cores, at least 2. */
  threads?: number;
  /** Runs one caller may have at once; default threads − 1 (at least 1), so another caller always finds a thread. */
  perCaller?: number;
  /** Runs one caller may keep waiting; default 4. */
  queuePerCaller?: number;
  /** Heap limit of a worker thread, MiB; default 1536. A run that needs more ends as a limit error. */
  memoryMb?: number;
}

/** A stop reason that reads as a time limit (see cancelledError). */
export function budgetReason(budgetMs: number): Error {
  return Object.assign(new Error(`time budget of ${budgetMs} ms`), { name: "TimeoutError", budgetMs });
}

export class CompilePool {
  readonly pool: Piscina;
  readonly queue: FairQueue;
  readonly memoryMb: number;

  constructor(o: PoolOptions = {}) {
    const threads = o.threads ?? Math.max(2, availableParallelism());
    this.memoryMb = o.memoryMb ?? 1536;
    this.pool = new Piscina({
      filename: o.file ?? path.join(process.cwd(), ".build/pipeline-worker.mjs"),
      // Every thread starts with the pool and stays, so a compile never waits for a thread to boot.
      minThreads: threads,
      maxThreads: threads,
      concurrentTasksPerWorker: 1,
      resourceLimits: { maxOldGenerationSizeMb: this.memoryMb },
    });
    this.queue = new FairQueue(threads, o.perCaller ?? Math.max(1, threads - 1), o.queuePerCaller ?? 4);
  }

  /**
   * An executor for one caller: waits its turn, then runs on a thread within
   * `budgetMs` (waiting counts against the budget too). The control's signal
   * cancels it at any point.
   */
  executor(caller: string, budgetMs: number): Executor {
    return async (job, control) => {
      const budget = new AbortController();
      const timer = setTimeout(() => budget.abort(budgetReason(budgetMs)), budgetMs);
      const signal = control.signal ? AbortSignal.any([control.signal, budget.signal]) : budget.signal;
      let release: (() => void) | null = null;
      try {
        release = await this.queue.acquire(caller, signal);
        const channel = new MessageChannel();
        if (control.onProgress) channel.port1.on("message", (p: Progress) => control.onProgress!(p));
        try {
          return (await this.pool.run({ job, port: channel.port2 }, { signal, transferList: [channel.port2] })) as StageOutcome;
        } finally {
          channel.port1.close();
        }
      } catch (e) {
        if (signal.aborted) return { ok: false, error: cancelledError(signal) };
        if (e instanceof QueueFull) throw e;
        const code = (e as { code?: string }).code;
        if (code === "ERR_WORKER_OUT_OF_MEMORY") return { ok: false, error: this.memoryError() };
        throw e;
      } finally {
        clearTimeout(timer);
        release?.();
      }
    };
  }

  private memoryError(): PipelineError {
    return {
      code: "limit",
      message: `The compile needed more than the ${this.memoryMb} MiB of memory a run may use.`,
      what: `memory limit of ${this.memoryMb} MiB`,
      hint: "Tick Heuristic only, or split the design into smaller designs.",
    };
  }

  async close(): Promise<void> {
    await this.pool.destroy();
  }
}
