/**
 * The worker thread of the compile pool: runs the pipeline's stages for one
 * job at a time. Built to .build/pipeline-worker.mjs (lib/scripts/build.mjs),
 * so the server never transpiles at run time. Progress goes back on the port
 * the task brings.
 */
import type { MessagePort } from "node:worker_threads";
import { runStages, type StageJob, type StageOutcome } from "../pipeline/stages";

export default function run({ job, port }: { job: StageJob; port?: MessagePort }): StageOutcome {
  try {
    return runStages(job, port ? (p) => port.postMessage(p) : undefined);
  } finally {
    port?.close();
  }
}
