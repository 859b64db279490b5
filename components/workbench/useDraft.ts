"use client";
/**
 * Keeps the workbench's draft on the server. The text is sent a moment after
 * typing stops (and at the latest every few seconds while typing goes on),
 * when the tab is hidden, and when the page is left; "kept" is reported only
 * once the server has answered with the very text on screen.
 *
 * Every write names the draft version it started from. When another tab or
 * person wrote the draft meanwhile, the server refuses with 409 and the draft
 * as it now is; nothing is sent again until the designer chooses to keep
 * their text (written over the other, which the other side then sees as a
 * conflict of its own) or to take the other.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { ApiError } from "@/lib/client/fetcher";
import type { WorkbenchSettings } from "./types";

export interface DraftValue {
  source: string;
  familyId: string;
  settings: WorkbenchSettings;
}

export interface ServerDraft extends DraftValue {
  version: number;
  updatedAt: string | null;
  updatedBy: { id: string; name: string } | null;
}

export type DraftStatus = "kept" | "changed" | "keeping" | "failed" | "conflict";

/** Quiet time after the last change before the draft is sent, ms. */
export const DRAFT_PAUSE_MS = 600;
/** While typing goes on without a pause, the draft is still sent this often, ms. */
export const DRAFT_MAX_WAIT_MS = 1_800;

/** A key that is equal for equal drafts, whatever the order of the settings' fields. */
export function draftKey(v: DraftValue): string {
  return JSON.stringify([v.source, v.familyId, sorted(v.settings)]);
}

function sorted(o: object): unknown {
  return Object.fromEntries(
    Object.entries(o)
      .filter(([, x]) => x !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)),
  );
}

interface DesignAnswer {
  design: {
    draftSource: string;
    family: { id: string };
    settings: Record<string, unknown>;
    draftVersion: number;
    draftUpdatedAt: string | null;
    draftUpdatedBy: { id: string; name: string } | null;
  };
}

/** The draft part of a design as the API answers it. */
export function serverDraftOf(d: DesignAnswer["design"]): ServerDraft {
  const { familyId: _f, ...settings } = d.settings ?? {};
  return {
    source: d.draftSource,
    familyId: d.family.id,
    settings: settings as WorkbenchSettings,
    version: d.draftVersion,
    updatedAt: d.draftUpdatedAt,
    updatedBy: d.draftUpdatedBy,
  };
}

export function useDraft({ url, local, loaded, enabled, onAdopt, onSaved }: {
  /** PUT address of the draft. */
  url: string;
  /** What is on screen now; null until the design has loaded. */
  local: DraftValue | null;
  /** The draft as the server last reported it (from the design's GET); newer versions are taken when nothing is unsaved. */
  loaded: ServerDraft | null;
  /** False for roles that may not edit: nothing is ever sent. */
  enabled: boolean;
  /** Puts a draft from the server on screen (another tab's newer draft, or "take theirs"). */
  onAdopt: (v: ServerDraft) => void;
  /** Called with the design the server answered after each successful write. */
  onSaved?: (answer: DesignAnswer) => void;
}) {
  const server = useRef<ServerDraft | null>(null);
  const localRef = useRef<DraftValue | null>(local);
  localRef.current = local;
  const inFlight = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const firstChangeAt = useRef<number | null>(null);
  const retryMs = useRef(0);
  const [status, setStatus] = useState<DraftStatus>("kept");
  const [error, setError] = useState<string | null>(null);
  const [conflict, setConflict] = useState<ServerDraft | null>(null);
  const conflictRef = useRef<ServerDraft | null>(null);
  conflictRef.current = conflict;
  const onAdoptRef = useRef(onAdopt);
  onAdoptRef.current = onAdopt;
  const onSavedRef = useRef(onSaved);
  onSavedRef.current = onSaved;

  const localKey = local ? draftKey(local) : null;
  const dirty = useCallback(() => {
    const l = localRef.current;
    return !!(l && server.current && draftKey(l) !== draftKey(server.current));
  }, []);

  // The server's draft: the first one loaded, and later ones when nothing here is unsaved.
  useEffect(() => {
    if (!loaded) return;
    const s = server.current;
    if (!s) {
      server.current = loaded;
      return;
    }
    if (loaded.version > s.version && !inFlight.current && !conflictRef.current) {
      const l = localRef.current;
      if (l && draftKey(l) === draftKey(loaded)) {
        // The server holds the text on screen already (a revision saved from it moved the draft on).
        server.current = loaded;
        setStatus("kept");
      } else if (!dirty()) {
        server.current = loaded;
        onAdoptRef.current(loaded);
        setStatus("kept");
      }
    }
  }, [loaded, dirty]);

  const body = (v: DraftValue, base: number) => JSON.stringify({ source: v.source, familyId: v.familyId, settings: v.settings, baseVersion: base });

  const sendRef = useRef<() => Promise<void>>(async () => {});
  const schedule = useCallback((ms: number) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void sendRef.current(), ms);
  }, []);

  const send = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const v = localRef.current;
    const s = server.current;
    if (!enabled || !v || !s || conflictRef.current || inFlight.current) return;
    if (draftKey(v) === draftKey(s)) {
      setStatus("kept");
      return;
    }
    inFlight.current = true;
    firstChangeAt.current = null;
    setStatus("keeping");
    try {
      const res = await fetch(url, {
        method: "PUT",
        credentials: "same-origin",
        headers: { "content-type": "application/json" },
        body: body(v, s.version),
      });
      const text = await res.text();
      const json = text ? (JSON.parse(text) as unknown) : null;
      if (res.ok) {
        const answer = json as DesignAnswer;
        server.current = serverDraftOf(answer.design);
        retryMs.current = 0;
        setError(null);
        onSavedRef.current?.(answer);
      } else {
        const err = (json as { error?: { code?: string; message?: string; details?: { draft?: ServerDraft } } } | null)?.error;
        if (res.status === 409 && err?.details?.draft) {
          const theirs = err.details.draft;
          setConflict({ ...theirs, settings: stripFamily(theirs.settings) });
          setError(err.message ?? "The draft was changed elsewhere.");
          setStatus("conflict");
          return;
        }
        throw new ApiError(res.status, err?.code ?? `http_${res.status}`, err?.message ?? `The server answered ${res.status}.`);
      }
    } catch (e) {
      // A refusal of the input (400, 403, 404) waits for the next change; anything else is tried again.
      const refused = e instanceof ApiError && e.status >= 400 && e.status < 500 && e.status !== 429;
      setError(e instanceof ApiError ? e.message : "The server could not be reached.");
      setStatus("failed");
      if (!refused) {
        retryMs.current = Math.min(30_000, retryMs.current ? retryMs.current * 2 : 2_000);
        schedule(retryMs.current);
      }
      return;
    } finally {
      inFlight.current = false;
    }
    // Typing went on while the write was under way: send the rest.
    if (dirty()) schedule(0);
    else setStatus("kept");
  }, [enabled, url, dirty, schedule]);
  sendRef.current = send;

  // Every change: wait for a pause, but never longer than the maximum wait since the first unsent change.
  useEffect(() => {
    if (!enabled || localKey === null || !server.current || conflictRef.current) return;
    if (!dirty()) {
      if (!inFlight.current) setStatus((st) => (st === "failed" ? st : "kept"));
      return;
    }
    setStatus((st) => (st === "keeping" ? st : "changed"));
    const now = Date.now();
    firstChangeAt.current ??= now;
    const wait = Math.max(0, Math.min(DRAFT_PAUSE_MS, firstChangeAt.current + DRAFT_MAX_WAIT_MS - now));
    schedule(wait);
  }, [localKey, enabled, dirty, schedule]);

  // Leaving: a hidden tab sends now; a closing page sends with keepalive and asks first while anything is unsent.
  useEffect(() => {
    if (!enabled) return;
    const leaveWrite = () => {
      const v = localRef.current;
      const s = server.current;
      if (!v || !s || conflictRef.current || !dirty()) return;
      try {
        void fetch(url, {
          method: "PUT",
          keepalive: true,
          credentials: "same-origin",
          headers: { "content-type": "application/json" },
          body: body(v, s.version),
        }).catch(() => {});
      } catch {
        /* a body over the keepalive quota: the warning below has asked already */
      }
    };
    const onHidden = () => {
      if (document.visibilityState === "hidden") void send();
    };
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      if (dirty() || inFlight.current || conflictRef.current) {
        e.preventDefault();
        e.returnValue = "";
      }
    };
    window.addEventListener("pagehide", leaveWrite);
    window.addEventListener("beforeunload", onBeforeUnload);
    document.addEventListener("visibilitychange", onHidden);
    return () => {
      window.removeEventListener("pagehide", leaveWrite);
      window.removeEventListener("beforeunload", onBeforeUnload);
      document.removeEventListener("visibilitychange", onHidden);
      // Leaving the page inside the app (a link): what is unsent goes now.
      leaveWrite();
    };
  }, [enabled, url, dirty, send]);

  useEffect(() => () => {
    if (timer.current) clearTimeout(timer.current);
  }, []);

  const keepMine = useCallback(() => {
    const theirs = conflictRef.current;
    if (!theirs) return;
    server.current = theirs;
    conflictRef.current = null;
    setConflict(null);
    setError(null);
    void send();
  }, [send]);

  const takeTheirs = useCallback(() => {
    const theirs = conflictRef.current;
    if (!theirs) return;
    server.current = theirs;
    conflictRef.current = null;
    setConflict(null);
    setError(null);
    setStatus("kept");
    onAdoptRef.current(theirs);
  }, []);

  /** The version the text on screen started from (for a revision save). */
  const baseVersion = () => server.current?.version;

  return useMemo(
    () => ({ status, error, conflict, keepMine, takeTheirs, baseVersion, flush: send }),
    [status, error, conflict, keepMine, takeTheirs, send],
  );
}

function stripFamily(s: Record<string, unknown> | WorkbenchSettings): WorkbenchSettings {
  const { familyId: _f, ...rest } = s as Record<string, unknown>;
  return rest as WorkbenchSettings;
}
