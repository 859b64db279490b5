"use client";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import type { CompileResultBody } from "@/lib/api/compile-schema";

export interface JobInfo {
  id: string;
  status: "queued" | "running" | "done" | "failed" | "cancelled";
  stage: string | null;
  cost: number | null;
  lowerBound: number | null;
  primes: number | null;
  error: { message: string; hint?: string } | null;
  attempt: number;
  result: CompileResultBody | null;
}

const STAGE_WORDS: Record<string, string> = {
  minimize: "minimizing",
  map: "mapping onto the family and proving the netlist",
  factor: "building and proving the factored structure",
  analyse: "working out the figures",
  export: "finishing",
};

/**
 * A compile running to the end on a job worker: where it stands (stage, the
 * primes found, the best cost so far against the proven lower bound, as a bar
 * that fills as the gap closes), a Cancel, and the result once it is done.
 */
export function JobPanel({ ws, jobId, onDone, onClose }: {
  ws: string;
  jobId: string;
  onDone: (result: CompileResultBody) => void;
  onClose: () => void;
}) {
  const url = `/api/v1/workspaces/${ws}/jobs/${jobId}`;
  const { data, error, mutate } = useSWR<{ job: JobInfo }>(url, {
    refreshInterval: (d) => (d && ["done", "failed", "cancelled"].includes(d.job.status) ? 0 : 1000),
    onSuccess: (d) => {
      if (d.job.status === "done" && d.job.result) onDone(d.job.result);
    },
  });
  const job = data?.job;
  const cancel = async () => {
    await api(url, { method: "DELETE" }).catch(() => {});
    await mutate();
  };
  const gap = job?.cost != null && job.lowerBound != null ? job.cost - job.lowerBound : null;
  const filled = job?.cost ? Math.max(0.02, Math.min(1, (job.lowerBound ?? 0) / job.cost)) : 0;
  return (
    <div className="rounded border border-accent/50 bg-sheet px-3 py-2 text-sm" data-testid="job-panel" data-status={job?.status ?? "loading"}>
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-semibold">Running to the end in the background</span>
        <span className="text-graphite">
          {!job ? "…" : job.status === "queued" ? "waiting for a worker" : job.status === "running" ? (STAGE_WORDS[job.stage ?? ""] ?? "running") : job.status === "done" ? "done — the results below are the job's" : job.status === "cancelled" ? "stopped" : "failed"}
          {job && job.attempt > 1 && job.status !== "done" ? ` (taken over by another worker, try ${job.attempt})` : ""}
        </span>
        <span className="ml-auto flex gap-2">
          {job && (job.status === "queued" || job.status === "running") && (
            <button type="button" onClick={() => void cancel()} className="rounded border border-rule px-2 py-0.5 text-xs hover:border-ink">Cancel</button>
          )}
          {job && !(job.status === "queued" || job.status === "running") && (
            <button type="button" onClick={onClose} className="rounded border border-rule px-2 py-0.5 text-xs hover:border-ink">Close</button>
          )}
        </span>
      </div>
      {job?.cost == null && job?.primes != null && (
        <p className="mt-1 font-mono text-xs text-graphite tabular" data-testid="job-primes">{job.primes} prime implicants found · looking for a cover</p>
      )}
      {job?.cost != null && (
        <div className="mt-2">
          <div className="h-2 overflow-hidden rounded bg-rule/60" role="progressbar" aria-valuemin={0} aria-valuemax={job.cost} aria-valuenow={job.lowerBound ?? 0}
            aria-label="proven lower bound against the best cost found">
            <div className="h-full bg-accent transition-all" style={{ width: `${filled * 100}%` }} />
          </div>
          <p className="mt-1 font-mono text-xs text-graphite tabular">
            {job.primes != null ? `${job.primes} prime implicants · ` : ""}best cost {job.cost} · proven lower bound {job.lowerBound ?? "—"}
            {gap !== null ? (gap === 0 ? " · proven minimum" : ` · at most ${gap} above the minimum`) : ""}
          </p>
        </div>
      )}
      {job?.error && <p className="mt-1 text-vermilion">{job.error.message} {job.error.hint ?? ""}</p>}
      {error && <p className="mt-1 text-vermilion">{error instanceof ApiError ? error.message : "The job could not be read."}</p>}
    </div>
  );
}
