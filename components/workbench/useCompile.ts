"use client";
import { startTransition, useCallback, useEffect, useRef, useState } from "react";
import { api, ApiError } from "@/lib/client/fetcher";
import type { CompileResponse, WorkbenchSettings } from "./types";

/** Quiet time after the last keystroke before the source is compiled, ms. */
export const COMPILE_PAUSE_MS = 200;

/** The value after it has stopped changing for `ms` milliseconds. Give it a string or number: an object made anew each render never settles. */
export function useDebounced<T extends string | number | boolean | null | undefined>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

export interface CompileState {
  /** The last answer; kept while a newer compile runs, dropped when a newer one fails or is stopped. */
  data: CompileResponse | null;
  /** The text the answer belongs to. */
  dataKey: string | null;
  /** The newest compile failed (limit, server refusal, network). */
  error: ApiError | Error | null;
  /** Typing has not paused yet, or a compile is under way. */
  pending: boolean;
  /** The designer stopped the newest compile. */
  cancelled: boolean;
  cancel(): void;
  /** Runs the current text again (after a stop or a failure). */
  retry(): void;
}

/**
 * Compiles the source through the API a moment after typing stops. Only the
 * newest text's compile runs: a newer one aborts the one before, and the
 * server stops that run with it. Nothing is cached by text, so a long session
 * does not pile up old results.
 */
export function useCompile(ws: string, source: string | null, familyId: string | undefined, settings: WorkbenchSettings): CompileState {
  const key = source !== null && familyId ? JSON.stringify([source, familyId, settings]) : null;
  const settled = useDebounced(key, COMPILE_PAUSE_MS);
  const [state, setState] = useState<{ data: CompileResponse | null; dataKey: string | null; error: ApiError | Error | null; running: string | null; cancelled: boolean }>(
    { data: null, dataKey: null, error: null, running: null, cancelled: false },
  );
  const [attempt, setAttempt] = useState(0);
  const controller = useRef<AbortController | null>(null);

  useEffect(() => {
    if (!settled) return;
    const [src, fam, s] = JSON.parse(settled) as [string, string, WorkbenchSettings];
    controller.current?.abort();
    const c = new AbortController();
    controller.current = c;
    setState((st) => ({ ...st, running: settled, cancelled: false }));
    api<CompileResponse>("/api/v1/compile", {
      method: "POST",
      json: { source: src, workspace: ws, familyId: fam, settings: s },
      signal: c.signal,
    }).then(
      (data) => {
        if (c.signal.aborted) return;
        // A wide result renders in slices: typing and Cancel stay responsive meanwhile.
        startTransition(() => setState({ data, dataKey: settled, error: null, running: null, cancelled: false }));
      },
      (e: unknown) => {
        if (c.signal.aborted) return;
        setState({ data: null, dataKey: settled, error: e instanceof Error ? e : new Error(String(e)), running: null, cancelled: false });
      },
    );
    return () => c.abort();
  }, [settled, ws, attempt]);

  const cancel = useCallback(() => {
    controller.current?.abort();
    setState((st) => ({ ...st, data: null, running: null, cancelled: true }));
  }, []);
  const retry = useCallback(() => setAttempt((a) => a + 1), []);

  const waiting = key !== settled;
  return {
    data: state.data,
    dataKey: state.dataKey,
    error: state.error,
    pending: !state.cancelled && (waiting || state.running !== null),
    cancelled: state.cancelled,
    cancel,
    retry,
  };
}
