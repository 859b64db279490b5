/**
 * Runs {@link minimize} on a worker thread so that a long run can be given a
 * wall-clock budget and be cancelled. Server-side only (node:worker_threads);
 * the pure core stays in ./index.
 *
 * The worker starts from ./worker-boot.mjs, which registers tsx's loader and
 * then imports ./worker-thread.ts, so the same TypeScript sources run under
 * tsx, vitest and plain Node.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { FunctionSpec } from "../logic";
import { LimitError, type MinimizeOptions, type MinimizeResult } from "./types";

export interface WorkerRunOptions {
  /** Aborting terminates the worker and rejects with a LimitError (limit "aborted"). */
  signal?: AbortSignal;
  /** Wall-clock budget in milliseconds, worker start-up included. Default 30 000. */
  budgetMs?: number;
  /**
   * Path of worker-boot.mjs on disk. Default: beside this file, which is right
   * under tsx, vitest and Node; a bundled server (Next) passes the source path.
   */
  bootFile?: string;
}

/**
 * The Worker class, taken at run time so that a bundler does not try to bundle
 * the worker's entry: the worker runs the TypeScript sources through tsx.
 */
function workerClass(): typeof import("node:worker_threads").Worker {
  return process.getBuiltinModule("node:worker_threads").Worker;
}

function defaultBootFile(): string {
  return path.join(path.dirname(fileURLToPath(import.meta.url)), "worker-boot.mjs");
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
    const Worker = workerClass();
    const worker = new Worker(run.bootFile ?? defaultBootFile(), {
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
              "Choose the heuristic (the Heuristic only setting, or --heuristic on the command line), or split the design into smaller designs.",
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
