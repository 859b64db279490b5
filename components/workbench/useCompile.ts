"use client";
import { useEffect, useRef, useState } from "react";
import useSWR from "swr";
import { api } from "@/lib/client/fetcher";
import type { CompileResponse, WorkbenchSettings } from "./types";

/** The value after it has stopped changing for `ms` milliseconds. */
export function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/**
 * Compiles the source through the API a moment after typing stops. The
 * request can be cancelled; the server stops the minimization with it.
 */
export function useCompile(ws: string, source: string, familyId: string | undefined, settings: WorkbenchSettings) {
  const settingsKey = JSON.stringify(settings);
  const debounced = useDebounced({ source, familyId, settingsKey }, 350);
  const controller = useRef<AbortController | null>(null);
  const [cancelled, setCancelled] = useState(false);
  const key = debounced.familyId ? ["compile", ws, debounced.source, debounced.familyId, debounced.settingsKey] : null;
  const swr = useSWR<CompileResponse>(
    key,
    async ([, w, src, fam, s]: [string, string, string, string, string]) => {
      controller.current?.abort();
      const c = new AbortController();
      controller.current = c;
      setCancelled(false);
      return api<CompileResponse>("/api/v1/compile", {
        method: "POST",
        json: { source: src, workspace: w, familyId: fam, settings: JSON.parse(s) },
        signal: c.signal,
      });
    },
    { keepPreviousData: true, revalidateOnFocus: false, revalidateIfStale: false, dedupingInterval: 0 },
  );
  const pending = source !== debounced.source || settingsKey !== debounced.settingsKey || familyId !== debounced.familyId;
  return {
    ...swr,
    pending,
    cancelled,
    cancel() {
      controller.current?.abort();
      setCancelled(true);
    },
  };
}
