"use client";
import { startTransition, useCallback, useEffect, useRef, useState } from "react";
import { api, ApiError } from "@/lib/client/fetcher";
import type { CompileResponse, WorkbenchSettings } from "./types";

/** Quiet time after the last keystroke before the source is compiled, ms. */
export const COMPILE_PAUSE_MS = 200;

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
export function useCompile(ws: string, source: string | null, familyId: string | undefined, settings: WorkbenchSettings,
  /** When the text last changed (performance.now()), set by the editor's change handler: the pause counts from the keystroke, not from the render that followed it. */
  editedAt?: { readonly current: number }): CompileState {
  const key = source !== null && familyId ? JSON.stringify([source, familyId, settings]) : null;
  const [state, setState] = useState<{ data: CompileResponse | null; dataKey: string | null; error: ApiError | Error | null; running: string | null; asked: string | null; cancelled: boolean }>(
    { data: null, dataKey: null, error: null, running: null, asked: null, cancelled: false },
  );
  const [attempt, setAttempt] = useState(0);
  const keyRef = useRef(key);
  keyRef.current = key;
  const attemptRef = useRef(attempt);
  attemptRef.current = attempt;
  const controller = useRef<AbortController | null>(null);

  // The request leaves from the pause's timer itself: no render of the page stands between the pause and the compile.
  const start = useCallback((asked: string) => {
    const [src, fam, s] = JSON.parse(asked) as [string, string, WorkbenchSettings];
    controller.current?.abort();
    const c = new AbortController();
    controller.current = c;
    api<CompileResponse>("/api/v1/compile", {
      method: "POST",
      json: { source: src, workspace: ws, familyId: fam, settings: s },
      signal: c.signal,
    }).then(
      (data) => {
        if (c.signal.aborted) return;
        // A wide result renders in slices: typing and Cancel stay responsive meanwhile.
        startTransition(() => setState((st) => ({ ...st, data, dataKey: asked, error: null, running: null, cancelled: false })));
      },
      (e: unknown) => {
        if (c.signal.aborted) return;
        setState((st) => ({ ...st, data: null, dataKey: asked, error: e instanceof Error ? e : new Error(String(e)), running: null, cancelled: false }));
      },
    );
    setState((st) => ({ ...st, running: asked, asked, cancelled: false }));
  }, [ws]);

  // The text asked (or stopped) last, on which attempt: a text typed away and back is not asked again, and a
  // stopped one runs again only on Run again or when it changes.
  const last = useRef<{ key: string | null; attempt: number }>({ key: null, attempt: -1 });
  // The pause's timer, so that Cancel pressed during the pause stops the compile before it is sent.
  const pause = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => {
    if (!key) return;
    const l = last.current;
    if (l.key === key && l.attempt === attempt) return;
    const since = editedAt ? performance.now() - editedAt.current : 0;
    const t = setTimeout(() => {
      pause.current = null;
      last.current = { key, attempt };
      start(key);
    }, Math.max(0, COMPILE_PAUSE_MS - Math.max(0, since)));
    pause.current = t;
    return () => clearTimeout(t);
  }, [key, start, attempt, editedAt]);
  // Leaving the page stops the compile under way.
  useEffect(() => () => controller.current?.abort(), []);

  const cancel = useCallback(() => {
    if (pause.current) clearTimeout(pause.current);
    pause.current = null;
    controller.current?.abort();
    // The text on screen counts as asked and stopped: it runs again on Run again, or when it changes.
    last.current = { key: keyRef.current, attempt: attemptRef.current };
    setState((st) => ({ ...st, data: null, running: null, cancelled: true }));
  }, []);
  const retry = useCallback(() => setAttempt((a) => a + 1), []);

  const waiting = key !== state.asked;
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
