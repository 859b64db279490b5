"use client";
import { Fragment, useState } from "react";
import type { DiffLine } from "@/lib/review";
import type { CommentView } from "@/lib/client/types";
import { fmtStamp } from "./format";

/**
 * The equation sources as a line diff: removed lines in vermilion, added in
 * the accent, each with its number on both sides. Lines of the `to` side are
 * anchors (#L4): comments of the review sit under their line with a mark in
 * the gutter, and a member who may comment clicks a line number to add one.
 */
export function SourceDiff({ lines, comments, canComment, onComment, fromLabel, toLabel }: {
  lines: DiffLine[];
  /** Comments tied to lines of the `to` side. */
  comments: CommentView[];
  /** When set, a click on a `to` line number opens a comment form for that line. */
  canComment: boolean;
  onComment?: (line: number, body: string) => Promise<void>;
  fromLabel: string;
  toLabel: string;
}) {
  const [open, setOpen] = useState<number | null>(null);
  const [text, setText] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const byLine = new Map<number, CommentView[]>();
  for (const c of comments) if (c.line !== null) byLine.set(c.line, [...(byLine.get(c.line) ?? []), c]);

  const submit = async () => {
    if (open === null || !onComment || !text.trim()) return;
    setBusy(true);
    setError(null);
    try {
      await onComment(open, text);
      setText("");
      setOpen(null);
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="overflow-x-auto rounded border border-rule bg-paper" data-testid="source-diff">
      <table className="w-full font-mono text-[13px] leading-5">
        <thead className="border-b border-rule text-left font-sans text-xs text-graphite">
          <tr>
            <th className="w-10 px-2 py-1 text-right" title={fromLabel}>{fromLabel}</th>
            <th className="w-10 px-2 py-1 text-right" title={toLabel}>{toLabel}</th>
            <th className="w-8" aria-label="Comments" />
            <th className="px-2 py-1">Equations</th>
          </tr>
        </thead>
        <tbody>
          {lines.map((l, i) => {
            const here = l.to !== null ? (byLine.get(l.to) ?? []) : [];
            const bg = l.kind === "added" ? "bg-accent/10" : l.kind === "removed" ? "bg-vermilion/10" : "";
            return (
              <Fragment key={i}>
                <tr id={l.to !== null ? `L${l.to}` : undefined} className={`${bg} align-top`} data-kind={l.kind} data-line={l.to ?? undefined}>
                  <td className="select-none px-2 text-right text-graphite">{l.from ?? ""}</td>
                  <td className="select-none px-2 text-right text-graphite">
                    {l.to !== null && canComment ? (
                      <button type="button" className="hover:text-accent hover:underline" aria-label={`Comment on line ${l.to}`}
                        onClick={() => { setOpen(open === l.to ? null : l.to); setError(null); }}>
                        {l.to}
                      </button>
                    ) : (l.to ?? "")}
                  </td>
                  <td className="select-none text-center">
                    {here.length > 0 && (
                      <a href={`#L${l.to}`} className="font-sans text-xs font-semibold text-amber" data-testid="line-glyph" title={`${here.length} comment${here.length === 1 ? "" : "s"} on line ${l.to}`}>
                        ◆{here.length > 1 ? here.length : ""}
                      </a>
                    )}
                  </td>
                  <td className={`whitespace-pre px-2 ${l.kind === "added" ? "text-accent" : l.kind === "removed" ? "text-vermilion line-through decoration-vermilion/40" : ""}`}>
                    <span className="mr-2 select-none text-graphite">{l.kind === "added" ? "+" : l.kind === "removed" ? "\u2212" : " "}</span>
                    {l.text || " "}
                  </td>
                </tr>
                {here.length > 0 && (
                  <tr data-testid="line-comments" data-line={l.to ?? undefined}>
                    <td colSpan={3} />
                    <td className="px-2 pb-2">
                      {here.map((c) => (
                        <div key={c.id} className="mt-1 max-w-3xl rounded border border-amber/40 bg-sheet px-3 py-1.5 font-sans text-sm">
                          <span className="font-semibold">{c.author.name}</span>{" "}
                          <span className="text-xs text-graphite">{fmtStamp(c.createdAt)}</span>
                          <p className="whitespace-pre-wrap">{c.body}</p>
                        </div>
                      ))}
                    </td>
                  </tr>
                )}
                {open !== null && open === l.to && (
                  <tr>
                    <td colSpan={3} />
                    <td className="px-2 pb-2 font-sans">
                      <form className="max-w-3xl space-y-1" onSubmit={(e) => { e.preventDefault(); void submit(); }}>
                        <label className="block text-xs text-graphite" htmlFor={`line-comment-${l.to}`}>Comment on line {l.to}</label>
                        <textarea id={`line-comment-${l.to}`} autoFocus value={text} onChange={(e) => setText(e.target.value)} rows={3}
                          className="w-full rounded border border-rule bg-paper px-2 py-1 text-sm" />
                        <div className="flex gap-2">
                          <button type="submit" disabled={busy || !text.trim()} className="rounded bg-accent px-3 py-1 text-sm font-semibold text-paper disabled:opacity-50">
                            Add line comment
                          </button>
                          <button type="button" onClick={() => setOpen(null)} className="rounded border border-rule px-3 py-1 text-sm">Cancel</button>
                        </div>
                        {error && <p role="alert" className="text-sm text-vermilion">{error}</p>}
                      </form>
                    </td>
                  </tr>
                )}
              </Fragment>
            );
          })}
          {lines.length === 0 && (
            <tr><td colSpan={4} className="px-2 py-4 text-center font-sans text-graphite">Both sides are empty.</td></tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
