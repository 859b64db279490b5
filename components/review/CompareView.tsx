"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo } from "react";
import useSWR, { useSWRConfig } from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { Comparison, DiffLine } from "@/lib/review";
import type { NetlistDocument } from "@/lib/export/json";
import type {
  DesignItem, DraftComparison, Page, ReviewDetail, ReviewSummary, RevisionComparison, RevisionSummary, WorkspaceInfo,
} from "@/lib/client/types";
import { fmtWhen } from "@/components/workspace/format";
import { FiguresCompare } from "./FiguresCompare";
import { SourceDiff } from "./SourceDiff";
import { SchematicPair } from "./SchematicPair";
import { AskReview, ReviewPanel, StateBadge } from "./ReviewPanel";

interface View {
  fromLabel: string;
  toLabel: string;
  comparison: Comparison;
  lines: DiffLine[];
  counts: { added: number; removed: number };
  from: { netlist: NetlistDocument | null; critical: { nets: string[]; gates: string[] } };
  to: { netlist: NetlistDocument | null; critical: { nets: string[]; gates: string[] } };
}

function fromComparison(c: RevisionComparison): View {
  return {
    fromLabel: `r${c.from.revision.number}`,
    toLabel: `r${c.to.revision.number}`,
    comparison: c.comparison,
    lines: c.source.lines,
    counts: { added: c.source.added, removed: c.source.removed },
    from: c.from,
    to: c.to,
  };
}

/**
 * Two versions of a design side by side — two revisions, or the unsaved draft
 * against a revision — with the review of the `to` revision beside them when
 * one is open in the address (?review=ID).
 */
export function CompareView({ ws, designId, from: fromParam, to: toParam, reviewId }: {
  ws: string;
  designId: string;
  from?: number;
  to?: number | "draft";
  reviewId?: string;
}) {
  const router = useRouter();
  const { mutate: refresh } = useSWRConfig();
  const dbase = `/api/v1/workspaces/${ws}/designs/${designId}`;
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: me } = useSWR<{ user: { id: string } }>("/api/v1/me");
  const { data: designData, error: designError } = useSWR<{ design: DesignItem }>(dbase);
  const { data: revs } = useSWR<Page<RevisionSummary>>(`${dbase}/revisions?limit=200`);
  const { data: reviewData, mutate: mutateReview } = useSWR<{ review: ReviewDetail }>(reviewId ? `/api/v1/workspaces/${ws}/reviews/${reviewId}` : null);
  const { data: designReviews, mutate: mutateDesignReviews } = useSWR<{ items: ReviewSummary[] }>(`${dbase}/reviews`);
  const role = wsData?.workspace.role;
  const review = reviewData?.review;
  const latest = revs?.items[0]?.number;

  // What to show: the address first, then the review's revision against the one before, then the latest two.
  const to: number | "draft" | undefined = toParam ?? review?.revision.number ?? latest;
  const from: number | undefined =
    fromParam ?? (to === "draft" ? latest : review && to === review.revision.number ? (review.compareFrom ?? undefined) : typeof to === "number" && to > 1 ? to - 1 : undefined);
  const waitingForReview = !!reviewId && !review && toParam === undefined;

  const pairKey = !waitingForReview && typeof to === "number" && from !== undefined ? `${dbase}/compare?from=${from}&to=${to}` : null;
  const { data: pair, error: pairError } = useSWR<RevisionComparison>(pairKey);

  // The unsaved draft: the server compiles it (the workbench's compile path) and sets it against the stored revision.
  const design = designData?.design;
  const draftMode = to === "draft";
  const draftKey = draftMode && from !== undefined ? `${dbase}/draft/compare?from=${from}` : null;
  const { data: draftPair, error: draftError } = useSWR<DraftComparison>(draftKey);

  const view: View | null = useMemo(() => {
    if (pair) return fromComparison(pair);
    if (!draftMode || !draftPair) return null;
    return {
      fromLabel: `r${draftPair.from.revision.number}`,
      toLabel: "draft",
      comparison: draftPair.comparison,
      lines: draftPair.source.lines,
      counts: { added: draftPair.source.added, removed: draftPair.source.removed },
      from: draftPair.from,
      to: draftPair.to,
    };
  }, [pair, draftMode, draftPair]);

  const go = (f: number | undefined, t: number | "draft" | undefined, rv: string | undefined = reviewId) => {
    const q = new URLSearchParams();
    if (f !== undefined) q.set("from", String(f));
    if (t !== undefined) q.set("to", String(t));
    if (rv) q.set("review", rv);
    router.replace(`/w/${ws}/d/${designId}/compare?${q.toString()}`);
  };

  if (designError) return <main className="p-8 text-vermilion" role="alert">{designError.message}</main>;
  const numbers = (revs?.items ?? []).map((r) => r.number);
  const toRevision = typeof to === "number" ? revs?.items.find((r) => r.number === to) : undefined;
  const lineCommentsShown = !!review && to === review.revision.number;
  const mayComment = role ? can(role, "review.comment") : false;
  const reviewsOfTo = typeof to === "number" ? (designReviews?.items ?? []).filter((r) => r.revision.number === to) : [];
  const openOfTo = reviewsOfTo.find((r) => r.state === "open");
  const compileErrors = draftMode && draftError instanceof ApiError && draftError.code === "compile_errors";
  const error = pairError ?? (draftMode && !compileErrors ? draftError : null);

  return (
    <main className="mx-auto max-w-[100rem] px-4 py-4">
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <Link href={`/w/${ws}/d/${designId}`} className="text-sm text-graphite hover:text-ink">← Workbench</Link>
        <h1 className="text-xl font-semibold">{design?.name ?? "…"} — compare</h1>
        <form className="flex items-center gap-2 text-sm" onSubmit={(e) => e.preventDefault()} data-testid="compare-pick">
          <label htmlFor="cmp-from" className="text-graphite">from</label>
          <select id="cmp-from" value={from ?? ""} onChange={(e) => go(Number(e.target.value), to)} className="rounded border border-rule bg-sheet px-2 py-1 font-mono">
            {from === undefined && <option value="">—</option>}
            {numbers.map((n) => <option key={n} value={n}>r{n}</option>)}
          </select>
          <span aria-hidden>→</span>
          <label htmlFor="cmp-to" className="sr-only">to</label>
          <select id="cmp-to" value={to ?? ""} onChange={(e) => go(from, e.target.value === "draft" ? "draft" : Number(e.target.value))}
            className="rounded border border-rule bg-sheet px-2 py-1 font-mono">
            {to === undefined && <option value="">—</option>}
            {numbers.map((n) => <option key={n} value={n}>r{n}</option>)}
            <option value="draft">unsaved draft</option>
          </select>
          {typeof to === "number" && from !== undefined && (
            <button type="button" onClick={() => go(to, from)} className="rounded border border-rule px-2 py-1 text-xs hover:border-ink" title="Swap the sides">swap</button>
          )}
        </form>
        <Link href={`/w/${ws}/reviews`} className="ml-auto text-sm text-graphite hover:text-ink">All reviews →</Link>
      </div>

      {toRevision && (
        <p className="mb-3 text-sm text-graphite">
          r{toRevision.number}: {toRevision.message} · {toRevision.author.name}
          {view && ` · ${view.counts.added} line${view.counts.added === 1 ? "" : "s"} added, ${view.counts.removed} removed`}
        </p>
      )}

      <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section className="rounded border border-rule bg-sheet p-3" aria-label="Figures">
          {error ? (
            <p role="alert" className="text-sm text-vermilion">{error.message}</p>
          ) : compileErrors ? (
            <p role="alert" className="text-sm text-vermilion">The draft has errors, so it has no figures yet; fix them in the workbench.</p>
          ) : from === undefined && latest !== undefined ? (
            <p className="text-sm text-graphite">
              r{latest} is the only revision. <button type="button" className="text-accent underline" onClick={() => go(latest, "draft")}>Compare the unsaved draft against it</button>.
            </p>
          ) : view ? (
            <FiguresCompare comparison={view.comparison} fromLabel={view.fromLabel} toLabel={view.toLabel} />
          ) : (
            <p className="text-sm text-graphite">{draftMode ? "Compiling the draft…" : "Loading the figures…"}</p>
          )}
        </section>

        <aside className="space-y-3">
          {review ? (
            <ReviewPanel ws={ws} designId={designId} review={review} meId={me?.user.id} role={role} lineCommentsShown={lineCommentsShown}
              onChange={(r) => {
                void mutateReview({ review: r }, { revalidate: false });
                void mutateDesignReviews();
                // the count of what waits in the navigation
                void refresh(`/api/v1/workspaces/${ws}/reviews`);
              }} />
          ) : reviewId ? (
            <p className="text-sm text-graphite">Loading the review…</p>
          ) : null}
          {!review && reviewsOfTo.length > 0 && (
            <div className="rounded border border-rule bg-sheet p-3 text-sm" data-testid="reviews-of-revision">
              <h2 className="mb-1 text-xs uppercase tracking-wide text-graphite">Reviews of r{String(to)}</h2>
              <ul className="space-y-1">
                {reviewsOfTo.map((r) => (
                  <li key={r.id} className="flex items-center gap-2">
                    <StateBadge state={r.state} />
                    <button type="button" className="text-accent hover:underline" onClick={() => go(from, to, r.id)}>
                      asked by {r.requestedBy.name}, {r.commentCount} comment{r.commentCount === 1 ? "" : "s"}
                    </button>
                  </li>
                ))}
              </ul>
            </div>
          )}
          {typeof to === "number" && toRevision && role && can(role, "review.request") && me && !openOfTo && (!review || review.revision.number !== to || review.state !== "open") && (
            <AskReview ws={ws} designId={designId} number={to} authorId={toRevision.author.id} meId={me.user.id}
              onAsked={(id) => { void mutateDesignReviews(); go(from, to, id); }} />
          )}
          {draftMode && (
            <p className="rounded border border-rule bg-sheet p-3 text-sm text-graphite" data-testid="draft-note">
              The draft is not a revision yet: save it in the workbench to ask for a review. Its figures here come from compiling it now
              {draftPair?.to.draft.updatedAt
                ? `, as last kept ${fmtWhen(draftPair.to.draft.updatedAt)}${draftPair.to.draft.updatedBy ? ` by ${draftPair.to.draft.updatedBy.name}` : ""}`
                : ""}
              .
            </p>
          )}
        </aside>
      </div>

      {view && (
        <>
          <section className="mt-4" aria-label="Equations">
            <h2 className="mb-1 text-xs uppercase tracking-wide text-graphite">
              Equations, {view.fromLabel} → {view.toLabel}
              {review && !lineCommentsShown && ` (the review's line comments are on r${review.revision.number}; pick it as "to" to see them in place)`}
            </h2>
            <SourceDiff lines={view.lines} comments={lineCommentsShown ? review!.comments : []}
              canComment={lineCommentsShown && mayComment} fromLabel={view.fromLabel} toLabel={view.toLabel}
              onComment={async (line, body) => {
                const r = await api<{ review: ReviewDetail }>(`/api/v1/workspaces/${ws}/reviews/${review!.id}/comments`, { method: "POST", json: { body, line } });
                await mutateReview({ review: r.review }, { revalidate: false });
              }} />
          </section>
          <section className="mt-4" aria-label="Schematics">
            <SchematicPair from={{ label: view.fromLabel, ...view.from }} to={{ label: view.toLabel, ...view.to }} />
          </section>
        </>
      )}
    </main>
  );
}
