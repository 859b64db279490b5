"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { VERDICT_WORDS, type CompatibilityPair, type Verdict } from "@/lib/families";

interface MatrixResponse {
  families: Array<{ id: string; key: string; name: string; builtin: boolean; archivedAt: string | null }>;
  pairs: CompatibilityPair[];
}

const TONE: Record<Verdict, string> = {
  compatible: "border-accent/40 bg-accent/10",
  "small-margin": "border-amber/60 bg-amber/15",
  "not-compatible": "border-vermilion/50 bg-vermilion/10",
  unknown: "border-rule bg-paper",
};
const MARK: Record<Verdict, string> = { compatible: "✓", "small-margin": "!", "not-compatible": "✕", unknown: "?" };

const v = (x: number | null, unit = "") => (x === null ? "—" : `${Number(x.toFixed(2))}${unit}`);

/** Every driver → receiver pair of the workspace's families: margins, inputs fed per output, and a verdict. */
export function CompatibilityMatrix({ ws }: { ws: string }) {
  const [archived, setArchived] = useState(false);
  const { data, error } = useSWR<MatrixResponse>(`/api/v1/workspaces/${ws}/families/matrix${archived ? "?archived=1" : ""}`);
  const [picked, setPicked] = useState<{ driver: string; receiver: string } | null>({ driver: "ttl-std-5v", receiver: "cmos-hc-5v" });
  if (error) return <p role="alert" className="text-sm text-vermilion">{error.message}</p>;
  if (!data) return <p className="text-sm text-graphite">Working out every pair…</p>;
  const name = (key: string) => data.families.find((f) => f.key === key)?.name ?? key;
  const cell = (d: string, r: string) => data.pairs.find((p) => p.driver === d && p.receiver === r);
  const detail = picked ? cell(picked.driver, picked.receiver) : undefined;

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-xl font-semibold">Compatibility of families</h1>
        <label className="flex items-center gap-1.5 text-sm text-graphite">
          <input type="checkbox" checked={archived} onChange={(e) => setArchived(e.target.checked)} />
          Include archived families
        </label>
        <Link href={`/w/${ws}/families`} className="text-sm text-graphite hover:text-ink">Families →</Link>
      </div>
      <p className="max-w-4xl text-sm text-graphite">
        Each row is a family whose output drives the inputs of the family in each column. A cell gives the noise margins
        (NMH = VOH(min) − VIH(min), NML = VIL(max) − VOL(max)) and how many receiver inputs one output may feed in the high
        state (IOH / IIH) and the low state (IOL / IIL). Point at a cell for its formulas, or choose it for the detail below.
      </p>
      <div className="overflow-x-auto rounded border border-rule bg-sheet">
        <table className="text-xs" data-testid="compat-matrix">
          <thead>
            <tr className="border-b border-rule">
              <th className="px-2 py-2 text-left font-semibold text-graphite">driver ↓ · receiver →</th>
              {data.families.map((f) => (
                <th key={f.key} scope="col" className="max-w-[9rem] px-2 py-2 text-left font-semibold leading-tight">
                  {f.name}{f.archivedAt && <span className="block font-normal text-graphite">archived</span>}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {data.families.map((d) => (
              <tr key={d.key} className="border-b border-rule/60 last:border-0">
                <th scope="row" className="max-w-[12rem] px-2 py-1.5 text-left font-semibold leading-tight">{d.name}</th>
                {data.families.map((r) => {
                  const p = cell(d.key, r.key)!;
                  const chosen = picked?.driver === d.key && picked.receiver === r.key;
                  return (
                    <td key={r.key} className="p-1">
                      <button type="button" data-pair={`${d.key}>${r.key}`} data-verdict={p.verdict}
                        onClick={() => setPicked({ driver: d.key, receiver: r.key })}
                        title={[`${d.name} → ${r.name}: ${VERDICT_WORDS[p.verdict]}`, p.formulas.nmh, p.formulas.nml,
                          `high: ${p.formulas.fanOutHigh}`, `low: ${p.formulas.fanOutLow}`, ...p.messages].join("\n")}
                        aria-label={`${d.name} driving ${r.name}: ${VERDICT_WORDS[p.verdict]}`}
                        className={`block w-full min-w-[7.5rem] rounded border px-2 py-1 text-left font-mono tabular ${TONE[p.verdict]} ${chosen ? "ring-2 ring-ink" : ""}`}>
                        <span className="flex justify-between gap-2"><span>{MARK[p.verdict]}</span><span>{v(p.nmhV)} / {v(p.nmlV)} V</span></span>
                        <span className="block text-graphite">H {p.fanOutHigh ?? "—"} · L {p.fanOutLow ?? "—"}</span>
                      </button>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="flex flex-wrap gap-4 text-xs text-graphite">
        <span><span className="font-mono">✓</span> compatible</span>
        <span><span className="font-mono">!</span> compatible with a small margin (below 0.3 V)</span>
        <span><span className="font-mono">✕</span> not compatible</span>
        <span><span className="font-mono">?</span> figures missing</span>
        <span>cells: NMH / NML · inputs fed high (H) and low (L)</span>
      </p>

      {detail && (
        <section className={`rounded border p-4 ${TONE[detail.verdict]}`} data-testid="pair-detail" aria-label="Pair detail">
          <h2 className="text-base font-semibold">
            {name(detail.driver)} → {name(detail.receiver)}: {VERDICT_WORDS[detail.verdict]}
          </h2>
          <dl className="mt-2 grid gap-x-6 gap-y-1 font-mono text-xs sm:grid-cols-[auto_1fr]">
            <dt className="text-graphite">noise margin high</dt><dd>{detail.formulas.nmh}</dd>
            <dt className="text-graphite">noise margin low</dt><dd>{detail.formulas.nml}</dd>
            <dt className="text-graphite">inputs fed, high</dt><dd>{detail.formulas.fanOutHigh}</dd>
            <dt className="text-graphite">inputs fed, low</dt><dd>{detail.formulas.fanOutLow}</dd>
            <dt className="text-graphite">edge-rate limit</dt><dd>{detail.formulas.fanOutAc}</dd>
            <dt className="text-graphite">output point</dt>
            <dd>{detail.point === "rated" ? "the driver's rated (heavier) output point: its light-load current cannot feed one input" : detail.point === "light" ? "the driver's light-load output point" : "—"}</dd>
          </dl>
          {detail.messages.length > 0 && (
            <ul className="mt-3 list-disc space-y-1 pl-5 text-sm">
              {detail.messages.map((m, i) => <li key={i}>{m}</li>)}
            </ul>
          )}
        </section>
      )}
      <p className="rounded border border-amber/40 bg-amber/10 px-3 py-2 text-xs">
        Estimates from each family&apos;s figures (see their sources on the families page): check the data sheets of the parts you
        use and your own design rules, and allow for supply and temperature where the families run from different ones.
      </p>
    </div>
  );
}
