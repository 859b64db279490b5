// Worker side of ./worker.ts: one run per worker, result or error posted back.
import { parentPort, workerData } from "node:worker_threads";
import type { FunctionSpec } from "../logic";
import { LimitError, minimize, type MinimizeOptions } from "./index";

const { spec, options } = workerData as { spec: FunctionSpec; options: MinimizeOptions };
try {
  parentPort!.postMessage({ ok: true, result: minimize(spec, options) });
} catch (e) {
  const err = e as Error;
  parentPort!.postMessage({
    ok: false,
    error:
      e instanceof LimitError
        ? { name: "LimitError", message: err.message, limit: e.limit, value: e.value, hint: e.hint }
        : { name: err.name, message: err.message },
  });
}
