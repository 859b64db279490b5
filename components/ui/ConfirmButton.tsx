"use client";
import { useState } from "react";

/**
 * A button for a step that cannot be undone: the first click asks, in place,
 * what will happen; only the second (the named confirmation) does it.
 */
export function ConfirmButton({ label, question, confirm, onConfirm, disabled, title }: {
  /** The button's own label, e.g. "Remove". */
  label: string;
  /** What will happen, asked as a question, e.g. "Remove Ada from the workspace?". */
  question: string;
  /** The confirming button's label, e.g. "Yes, remove". */
  confirm: string;
  onConfirm: () => void | Promise<void>;
  disabled?: boolean;
  title?: string;
}) {
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  if (!asking) {
    return (
      <button type="button" disabled={disabled} title={title} onClick={() => setAsking(true)}
        className="text-graphite hover:text-vermilion disabled:cursor-not-allowed disabled:opacity-40 disabled:hover:text-graphite">
        {label}
      </button>
    );
  }
  return (
    <span role="group" aria-label={question} className="inline-flex flex-wrap items-center justify-end gap-2 rounded border border-vermilion/40 bg-vermilion/5 px-2 py-1">
      <span className="text-ink">{question}</span>
      <button type="button" disabled={busy} autoFocus
        onClick={async () => {
          setBusy(true);
          try {
            await onConfirm();
          } finally {
            setBusy(false);
            setAsking(false);
          }
        }}
        className="rounded bg-vermilion px-2 py-0.5 font-semibold text-paper hover:opacity-90 disabled:opacity-60">
        {confirm}
      </button>
      <button type="button" onClick={() => setAsking(false)} className="rounded border border-rule px-2 py-0.5 hover:border-ink">
        Keep
      </button>
    </span>
  );
}
