"use client";
import Link from "next/link";
import useSWR from "swr";
import type { ReviewInbox, ReviewSummary, WorkspaceInfo } from "@/lib/client/types";
import { can } from "@/lib/auth/permissions";
import { fmtWhen } from "@/components/workspace/format";
import { StateBadge } from "./ReviewPanel";

const reviewHref = (ws: string, r: { id: string; design: { id: string } }) => `/w/${ws}/d/${r.design.id}/compare?review=${r.id}`;

function ReviewTable({ ws, items, empty, testId }: { ws: string; items: ReviewSummary[]; empty: string; testId: string }) {
  return (
    <table className="w-full text-sm" data-testid={testId}>
      <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
        <tr>
          <th className="px-2 py-1.5">Design</th>
          <th className="px-2 py-1.5">Revision</th>
          <th className="px-2 py-1.5">State</th>
          <th className="px-2 py-1.5">Asked by</th>
          <th className="px-2 py-1.5">Reviewers</th>
          <th className="px-2 py-1.5 text-right">Comments</th>
          <th className="px-2 py-1.5">Asked</th>
        </tr>
      </thead>
      <tbody>
        {items.map((r) => (
          <tr key={r.id} className="border-b border-rule/50 last:border-0" data-review={r.id}>
            <td className="px-2 py-1"><Link href={reviewHref(ws, r)} className="text-accent hover:underline">{r.design.name}</Link></td>
            <td className="px-2 py-1"><span className="font-mono">r{r.revision.number}</span> <span className="text-graphite">{r.revision.message}</span></td>
            <td className="px-2 py-1"><StateBadge state={r.state} /></td>
            <td className="px-2 py-1 text-graphite">{r.requestedBy.name}</td>
            <td className="px-2 py-1 text-graphite">
              {r.reviewers.map((p) => `${p.name}${p.verdict ? ` (${p.verdict === "approved" ? "approved" : "changes asked"})` : ""}`).join(", ")}
            </td>
            <td className="px-2 py-1 text-right font-mono tabular">{r.commentCount}</td>
            <td className="px-2 py-1 text-graphite" title={r.createdAt}>{fmtWhen(r.createdAt)}</td>
          </tr>
        ))}
        {items.length === 0 && <tr><td colSpan={7} className="px-2 py-4 text-center text-graphite">{empty}</td></tr>}
      </tbody>
    </table>
  );
}

/** The reviewer's page: what waits for me, what I asked for, and the workspace's recent decisions. */
export function ReviewsInbox({ ws }: { ws: string }) {
  const { data, error } = useSWR<ReviewInbox>(`/api/v1/workspaces/${ws}/reviews`);
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  // Reviewers and viewers do not ask for reviews: no empty "asked by me" list for them.
  const mayAsk = wsData ? can(wsData.workspace.role, "review.request") : false;
  if (error) return <main className="p-8 text-vermilion" role="alert">{error.message}</main>;
  return (
    <main className="mx-auto max-w-[100rem] space-y-6 px-4 py-6">
      <h1 className="text-xl font-semibold">Reviews</h1>
      {!data ? (
        <p className="text-sm text-graphite">Loading…</p>
      ) : (
        <>
          <section className="rounded border border-rule bg-sheet p-3">
            <h2 className="mb-2 text-xs uppercase tracking-wide text-graphite">Waiting for me ({data.waitingForMe.length})</h2>
            <ReviewTable ws={ws} items={data.waitingForMe} testId="waiting-for-me" empty="Nothing waits for your decision." />
          </section>
          {(mayAsk || data.askedByMe.length > 0) && (
            <section className="rounded border border-rule bg-sheet p-3">
              <h2 className="mb-2 text-xs uppercase tracking-wide text-graphite">Asked by me</h2>
              <ReviewTable ws={ws} items={data.askedByMe} testId="asked-by-me" empty="You have not asked for a review here. Open a design's revisions and choose compare to ask." />
            </section>
          )}
          <section className="rounded border border-rule bg-sheet p-3">
            <h2 className="mb-2 text-xs uppercase tracking-wide text-graphite">Recent decisions</h2>
            <ol className="space-y-1 text-sm" data-testid="recent-decisions">
              {data.recentDecisions.map((d) => (
                <li key={d.id} className="flex flex-wrap items-baseline gap-2 border-b border-rule/50 py-1 last:border-0">
                  <span className="text-graphite" title={d.createdAt}>{fmtWhen(d.createdAt)}</span>
                  <span className="font-semibold">{d.user.name}</span>
                  <StateBadge state={d.verdict} />
                  <Link href={reviewHref(ws, { id: d.reviewId, design: d.design })} className="text-accent hover:underline">
                    {d.design.name} r{d.revision}
                  </Link>
                  {d.note && <span className="text-graphite">— {d.note}</span>}
                </li>
              ))}
              {data.recentDecisions.length === 0 && <li className="text-graphite">No decisions yet.</li>}
            </ol>
          </section>
        </>
      )}
    </main>
  );
}
