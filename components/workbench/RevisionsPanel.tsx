"use client";
import { memo } from "react";
import Link from "next/link";
import useSWR from "swr";
import type { ReviewSummary, RevisionSummary } from "@/lib/client/types";
import { StateBadge } from "@/components/review/ReviewPanel";
import { RevisionChart } from "./RevisionChart";
import { fmtInt, fmtNs, fmtWhen } from "@/components/workspace/format";

const formats = [
  ["verilog", "Verilog"],
  ["vhdl", "VHDL"],
  ["csv", "CSV"],
  ["json", "JSON"],
] as const;

/** The design's revisions, newest first, with their figures, a chart and the downloads. */
function RevisionsPanelView({ ws, designId, revisions }: { ws: string; designId: string; revisions: RevisionSummary[] }) {
  const base = `/api/v1/workspaces/${ws}/designs/${designId}/revisions`;
  const { data: reviews } = useSWR<{ items: ReviewSummary[] }>(`/api/v1/workspaces/${ws}/designs/${designId}/reviews`);
  // The newest review of each revision (the list comes newest first).
  const reviewOf = new Map<number, ReviewSummary>();
  for (const r of reviews?.items ?? []) if (!reviewOf.has(r.revision.number)) reviewOf.set(r.revision.number, r);
  const compare = `/w/${ws}/d/${designId}/compare`;
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_36rem]">
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="revision-list">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
            <tr>
              <th className="px-2 py-1.5">No.</th>
              <th className="px-2 py-1.5">Message</th>
              <th className="px-2 py-1.5">Author</th>
              <th className="px-2 py-1.5">When</th>
              <th className="px-2 py-1.5">Structure</th>
              <th className="px-2 py-1.5 text-right">Gates</th>
              <th className="px-2 py-1.5 text-right">Depth</th>
              <th className="px-2 py-1.5 text-right">Delay (est.)</th>
              <th className="px-2 py-1.5">Review</th>
              <th className="px-2 py-1.5">Files</th>
            </tr>
          </thead>
          <tbody className="tabular">
            {revisions.map((r) => (
              <tr key={r.id} className="border-b border-rule/50 last:border-0" data-revision={r.number}>
                <td className="px-2 py-1 font-mono">
                  <Link prefetch={false} href={`/w/${ws}/d/${designId}/r/${r.number}`} className="text-accent hover:underline">r{r.number}</Link>
                </td>
                <td className="px-2 py-1">{r.message}</td>
                <td className="px-2 py-1 text-graphite">{r.author.name}</td>
                <td className="px-2 py-1 text-graphite" title={r.createdAt}>{fmtWhen(r.createdAt)}</td>
                <td className="px-2 py-1 text-graphite" data-testid="revision-structure">{r.stats.structure === "factored" ? "factored" : "two-level"}</td>
                <td className="px-2 py-1 text-right font-mono">{fmtInt(r.stats.gates as number | undefined)}</td>
                <td className="px-2 py-1 text-right font-mono">{fmtInt(r.stats.depth as number | undefined)}</td>
                <td className="px-2 py-1 text-right font-mono">{fmtNs(r.stats.delayNs as number | null | undefined)}</td>
                <td className="whitespace-nowrap px-2 py-1 text-xs" data-testid="revision-review">
                  {reviewOf.has(r.number) && (
                    <Link prefetch={false} href={`${compare}?review=${reviewOf.get(r.number)!.id}`} className="mr-2"><StateBadge state={reviewOf.get(r.number)!.state} /></Link>
                  )}
                  {r.number > 1 && <Link prefetch={false} href={`${compare}?from=${r.number - 1}&to=${r.number}`} className="text-accent hover:underline">compare</Link>}
                </td>
                <td className="whitespace-nowrap px-2 py-1 text-xs">
                  {formats.map(([f, label]) => (
                    <a key={f} href={`${base}/${r.number}/export?format=${f}`} className="mr-2 text-graphite hover:text-ink" download>
                      {label}
                    </a>
                  ))}
                </td>
              </tr>
            ))}
            {revisions.length === 0 && (
              <tr><td colSpan={9} className="px-2 py-6 text-center text-graphite">No revisions yet — save one with Ctrl+S.</td></tr>
            )}
          </tbody>
        </table>
        <p className="mt-1 text-xs text-graphite">
          Delays are estimates from the family&apos;s typical figures; check the parts&apos; data sheets and your design rules.
        </p>
      </div>
      <RevisionChart revisions={revisions} />
    </div>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const RevisionsPanel = memo(RevisionsPanelView);
