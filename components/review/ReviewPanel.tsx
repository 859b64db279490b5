"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { ReviewDetail, Role } from "@/lib/client/types";
import { STATE_LABELS, fmtStamp, stateClass } from "./format";

export function StateBadge({ state }: { state: ReviewDetail["state"] }) {
  return (
    <span className={`rounded-full border px-2 py-0.5 text-xs font-semibold ${stateClass(state)}`} data-state={state}>
      {STATE_LABELS[state]}
    </span>
  );
}

interface Member {
  userId: string;
  name: string;
  role: Role;
}

const message = (e: unknown) => (e instanceof ApiError || e instanceof Error ? e.message : String(e));

/** Asks members who may approve to review revision `number`; the revision's author and the caller are left out. */
export function AskReview({ ws, designId, number, authorId, meId, onAsked }: {
  ws: string;
  designId: string;
  number: number;
  authorId: string;
  meId: string;
  onAsked: (reviewId: string) => void;
}) {
  const { data } = useSWR<{ items: Member[] }>(`/api/v1/workspaces/${ws}/members`);
  const [open, setOpen] = useState(false);
  const [chosen, setChosen] = useState<string[]>([]);
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const eligible = (data?.items ?? []).filter((m) => can(m.role, "review.approve") && m.userId !== authorId && m.userId !== meId);

  if (!open) {
    return (
      <button type="button" onClick={() => setOpen(true)} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90">
        Ask for review of r{number}
      </button>
    );
  }
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ review: { id: string }; mailFailed: string[] }>(`/api/v1/workspaces/${ws}/designs/${designId}/reviews`, {
        method: "POST",
        json: { revision: number, reviewers: chosen, message: note },
      });
      if (r.mailFailed.length) setError(`The review is recorded, but the mail to ${r.mailFailed.join(", ")} could not be sent; tell them yourself.`);
      onAsked(r.review.id);
    } catch (e) {
      setError(message(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <form className="space-y-2 rounded border border-accent/50 bg-sheet p-3" onSubmit={(e) => { e.preventDefault(); void submit(); }} data-testid="ask-review">
      <p className="text-sm font-semibold">Ask for a review of r{number}</p>
      {eligible.length === 0 ? (
        <p className="text-sm text-graphite">No other member may approve this revision: invite a reviewer first.</p>
      ) : (
        <fieldset className="space-y-1">
          <legend className="text-xs text-graphite">Who reviews (reviewers and owners; not the revision&apos;s author)</legend>
          {eligible.map((m) => (
            <label key={m.userId} className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={chosen.includes(m.userId)}
                onChange={(e) => setChosen((c) => (e.target.checked ? [...c, m.userId] : c.filter((x) => x !== m.userId)))} />
              {m.name} <span className="text-xs text-graphite">{m.role}</span>
            </label>
          ))}
        </fieldset>
      )}
      <label className="block text-xs text-graphite" htmlFor="review-message">Message to the reviewers</label>
      <textarea id="review-message" value={note} onChange={(e) => setNote(e.target.value)} rows={3}
        placeholder="What should they look at?" className="w-full rounded border border-rule bg-paper px-2 py-1 text-sm" />
      <div className="flex gap-2">
        <button type="submit" disabled={busy || chosen.length === 0} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
          Send the request
        </button>
        <button type="button" onClick={() => setOpen(false)} className="rounded border border-rule px-3 py-1.5 text-sm">Cancel</button>
      </div>
      {error && <p role="alert" className="text-sm text-vermilion">{error}</p>}
    </form>
  );
}

/**
 * A review beside the comparison: its state, who was asked and what each
 * decided, the history of decisions, the thread, and the actions the caller's
 * role and place allow (comment, approve or ask for changes, withdraw).
 */
export function ReviewPanel({ ws, designId, review, meId, role, onChange, lineCommentsShown }: {
  ws: string;
  designId: string;
  review: ReviewDetail;
  meId: string | undefined;
  role: Role | undefined;
  onChange: (r: ReviewDetail) => void;
  /** Whether the diff shows this revision's lines (so line comments sit there). */
  lineCommentsShown: boolean;
}) {
  const base = `/api/v1/workspaces/${ws}/reviews/${review.id}`;
  const [comment, setComment] = useState("");
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const mayComment = role ? can(role, "review.comment") : false;
  const asked = review.reviewers.find((r) => r.id === meId);
  const mayDecide = !!role && can(role, "review.approve") && review.state === "open" && !!asked && !asked.verdict && review.revision.author.id !== meId;
  const mayWithdraw = !!role && review.state === "open" && ((review.requestedBy.id === meId && can(role, "review.request")) || can(role, "review.manage"));

  const act = async (path: string, body: unknown, after?: () => void) => {
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ review: ReviewDetail }>(`${base}/${path}`, { method: "POST", json: body });
      onChange(r.review);
      after?.();
    } catch (e) {
      setError(message(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <section className="space-y-3 rounded border border-rule bg-sheet p-3" aria-label="Review" data-testid="review-panel">
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="text-base font-semibold">Review of r{review.revision.number}</h2>
        <StateBadge state={review.state} />
        <span className="text-xs text-graphite">asked by {review.requestedBy.name} · {fmtStamp(review.createdAt)}</span>
      </div>
      {review.message && <p className="whitespace-pre-wrap rounded border border-rule bg-paper px-3 py-2 text-sm">{review.message}</p>}

      <div>
        <h3 className="text-xs uppercase tracking-wide text-graphite">Asked to review</h3>
        <ul className="text-sm" data-testid="reviewers">
          {review.reviewers.map((r) => (
            <li key={r.id} className="flex items-center gap-2">
              {r.name}
              {r.verdict ? <StateBadge state={r.verdict} /> : <span className="text-xs text-graphite">{review.state === "open" ? "to decide" : "did not decide"}</span>}
            </li>
          ))}
        </ul>
      </div>

      {review.decisions.length > 0 && (
        <div>
          <h3 className="text-xs uppercase tracking-wide text-graphite">Decisions</h3>
          <ol className="space-y-1 text-sm" data-testid="decisions">
            {review.decisions.map((d) => (
              <li key={d.id} className="border-l-2 border-rule pl-2">
                <span className="font-semibold">{d.user.name}</span> <StateBadge state={d.verdict} /> on r{d.revision}{" "}
                <span className="text-xs text-graphite">{fmtStamp(d.createdAt)}</span>
                {d.note && <p className="whitespace-pre-wrap text-graphite">{d.note}</p>}
              </li>
            ))}
          </ol>
        </div>
      )}

      <div>
        <h3 className="text-xs uppercase tracking-wide text-graphite">Thread ({review.comments.length})</h3>
        <ol className="space-y-1.5 text-sm" data-testid="thread">
          {review.comments.map((c) => (
            <li key={c.id} className="rounded border border-rule bg-paper px-3 py-1.5">
              <span className="font-semibold">{c.author.name}</span>{" "}
              {c.line !== null && (
                lineCommentsShown
                  ? <a href={`#L${c.line}`} className="font-mono text-xs text-amber hover:underline">line {c.line}</a>
                  : <span className="font-mono text-xs text-amber">line {c.line}</span>
              )}{" "}
              <span className="text-xs text-graphite">{fmtStamp(c.createdAt)}</span>
              <p className="whitespace-pre-wrap">{c.body}</p>
            </li>
          ))}
          {review.comments.length === 0 && <li className="text-graphite">No comments yet.</li>}
        </ol>
        {mayComment ? (
          <form className="mt-2 space-y-1" onSubmit={(e) => { e.preventDefault(); void act("comments", { body: comment }, () => setComment("")); }}>
            <label htmlFor="general-comment" className="block text-xs text-graphite">
              General comment {lineCommentsShown ? "(click a line number in the equations to comment on a line)" : ""}
            </label>
            <textarea id="general-comment" value={comment} onChange={(e) => setComment(e.target.value)} rows={2}
              className="w-full rounded border border-rule bg-paper px-2 py-1 text-sm" />
            <button type="submit" disabled={busy || !comment.trim()} className="rounded border border-rule px-3 py-1 text-sm hover:border-ink disabled:opacity-50">
              Comment
            </button>
          </form>
        ) : (
          <p className="mt-1 text-xs text-graphite">Your role reads reviews; commenting is for reviewers, designers and owners.</p>
        )}
      </div>

      {mayDecide && (
        <form className="space-y-1 rounded border border-accent/50 bg-paper p-2" onSubmit={(e) => e.preventDefault()} data-testid="decide">
          <label htmlFor="decision-note" className="block text-xs text-graphite">Your decision on r{review.revision.number} — a note (required when asking for changes)</label>
          <textarea id="decision-note" value={note} onChange={(e) => setNote(e.target.value)} rows={2}
            className="w-full rounded border border-rule bg-sheet px-2 py-1 text-sm" />
          <div className="flex gap-2">
            <button type="button" disabled={busy} onClick={() => void act("decisions", { verdict: "approved", note }, () => setNote(""))}
              className="rounded bg-accent px-3 py-1 text-sm font-semibold text-paper disabled:opacity-50">Approve</button>
            <button type="button" disabled={busy || !note.trim()} onClick={() => void act("decisions", { verdict: "changes-asked", note }, () => setNote(""))}
              className="rounded border border-vermilion px-3 py-1 text-sm font-semibold text-vermilion disabled:opacity-50">Ask for changes</button>
          </div>
          <p className="text-xs text-graphite">Decisions are kept as history and cannot be changed afterwards.</p>
        </form>
      )}
      {asked && review.revision.author.id === meId && (
        <p className="text-xs text-graphite">You wrote r{review.revision.number}; someone else decides on it.</p>
      )}

      {review.state === "changes-asked" && review.requestedBy.id === meId && (
        <p className="rounded border border-vermilion/40 bg-vermilion/5 px-3 py-2 text-sm">
          Changes were asked. Answer in the thread, save a new revision in the{" "}
          <Link href={`/w/${ws}/d/${designId}`} className="text-accent underline">workbench</Link>, then ask again from its comparison.
        </p>
      )}

      {mayWithdraw && (
        <button type="button" disabled={busy} onClick={() => void act("withdraw", { note: "" })}
          className="rounded border border-rule px-3 py-1 text-xs text-graphite hover:border-ink disabled:opacity-50">
          Withdraw this review
        </button>
      )}
      {error && <p role="alert" className="text-sm text-vermilion">{error}</p>}
    </section>
  );
}
