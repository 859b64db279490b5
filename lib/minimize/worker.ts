/**
 * Runs {@link minimize} on a worker thread so that a long run can be given a
 * wall-clock budget and be cancelled. Server-side only (node:worker_threads);
 * the pure core stays in ./index.
 *
 * The worker starts from ./worker-boot.mjs, which registers tsx's loader and
 * then imports ./worker-thread.ts, so the same TypeScript sources run under
 * tsx, vitest and plain Node.
 */
import { Worker } from "node:worker_threads";
import type { FunctionSpec } from "../logic";
import { LimitError, type MinimizeOptions, type MinimizeResult } from "./types";

export interface WorkerRunOptions {
  /** Aborting terminates the worker and rejects with a LimitError (limit "aborted"). */
  signal?: AbortSignal;
  /** Wall-clock budget in milliseconds, worker start-up included. Default 30 000. */
  budgetMs?: number;
}

const DEFAULT_BUDGET_MS = 30_000;

/** {@link minimize} on a worker thread; rejects with LimitError on budget or abort. */
export function minimizeInWorker(
  spec: FunctionSpec,
  options: MinimizeOptions = {},
  run: WorkerRunOptions = {},
): Promise<MinimizeResult> {
  const budgetMs = run.budgetMs ?? DEFAULT_BUDGET_MS;
  return new Promise<MinimizeResult>((resolve, reject) => {
    if (run.signal?.aborted) {
      reject(new LimitError("aborted", 0, "the run was cancelled before it started", "Start it again when needed."));
      return;
    }
    const worker = new Worker(new URL("./worker-boot.mjs", import.meta.url), {
      workerData: { spec, options },
    });
    let settled = false;
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      run.signal?.removeEventListener("abort", onAbort);
      void worker.terminate();
      fn();
    };
    const timer = setTimeout(
      () =>
        finish(() =>
          reject(
            new LimitError(
              "budgetMs",
              budgetMs,
              `minimization did not finish within the time budget of ${budgetMs} ms`,
              "Raise the time budget, choose the heuristic, or split the design into smaller blocks.",
            ),
          ),
        ),
      budgetMs,
    );
    const onAbort = () =>
      finish(() => reject(new LimitError("aborted", 0, "the run was cancelled", "Start it again when needed.")));
    run.signal?.addEventListener("abort", onAbort);
    worker.on("message", (msg: { ok: true; result: MinimizeResult } | { ok: false; error: SerializedError }) => {
      finish(() => {
        if (msg.ok) resolve(msg.result);
        else reject(revive(msg.error));
      });
    });
    worker.on("error", (e) => finish(() => reject(e)));
    worker.on("exit", (code) => finish(() => reject(new Error(`the minimization worker stopped with code ${code}`))));
  });
}

export interface SerializedError {
  name: string;
  message: string;
  limit?: string;
  value?: number;
  hint?: string;
}

function revive(e: SerializedError): Error {
  if (e.name === "LimitError" && e.limit !== undefined) {
    const err = new LimitError(e.limit, e.value ?? 0, "", e.hint ?? "");
    err.message = e.message;
    return err;
  }
  const err = new Error(e.message);
  err.name = e.name;
  return err;
}
