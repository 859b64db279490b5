"use client";
import Link from "next/link";
import dynamic from "next/dynamic";
import { Fragment, useMemo, useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import { checkLibraryBlock, type Diagnostic } from "@/lib/lang";
import type { FamilyItem, LibraryItem, LibraryRevisionItem, WorkspaceInfo } from "@/lib/client/types";
import { fmtInt, fmtMw, fmtNs, fmtWhen } from "@/components/workspace/format";
import { FigureDeltas } from "./FigureDeltas";

const EquationEditor = dynamic(() => import("@/components/editor/EquationEditor"), {
  ssr: false,
  loading: () => <div className="h-64 animate-pulse rounded border border-rule bg-paper" />,
});

const NEW_BLOCK = `// A block for the library: its inputs are the parameters of a call, its outputs the results.
inputs a, b
outputs y

y = a * b
`;

type Revision = LibraryRevisionItem & { source: string };

/** One library: its blocks and their revisions with figures, where each is used, publishing and sharing. */
export function LibraryPage({ ws, libraryId }: { ws: string; libraryId: string }) {
  const url = `/api/v1/workspaces/${ws}/libraries/${libraryId}`;
  const { data, error, mutate } = useSWR<{ library: LibraryItem }>(url);
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const [publishing, setPublishing] = useState<{ block: string; source: string } | null>(null);
  const [shown, setShown] = useState<{ block: string; number: number } | null>(null);
  const lib = data?.library;
  const mayShare = !!lib && !lib.sharedIn && !!wsData && can(wsData.workspace.role, "library.share");
  const mayApprove = !!lib && !lib.sharedIn && !!wsData && can(wsData.workspace.role, "review.approve");

  if (error) return <p role="alert" className="text-vermilion">{error.message}</p>;
  if (!lib) return <p className="text-graphite">Loading…</p>;

  const startPublish = async (block: string | null) => {
    const b = lib.blocks.find((x) => x.name === block);
    let source = NEW_BLOCK;
    if (b && b.revisions.length) {
      const last = b.revisions[b.revisions.length - 1]!;
      const r = await api<{ revision: Revision }>(`${url}/blocks/${encodeURIComponent(b.name)}/revisions/${last.number}`);
      source = r.revision.source;
    }
    setPublishing({ block: block ?? "", source });
  };

  return (
    <div>
      <Link href={`/w/${ws}/libraries`} className="text-sm text-graphite hover:text-ink">← Libraries</Link>
      <div className="mb-2 mt-1 flex flex-wrap items-baseline gap-3">
        <h1 className="text-xl font-semibold">{lib.name}</h1>
        <code className="font-mono text-sm text-graphite" title="how use lines in this workspace write it">&quot;{lib.ref}&quot;</code>
        {lib.mayPublish && !publishing && (
          <button type="button" onClick={() => void startPublish(null)} className="ml-auto rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90">
            Publish a new block
          </button>
        )}
      </div>
      {lib.description && <p className="mb-2 text-sm text-graphite">{lib.description}</p>}
      {lib.sharedIn && (
        <p className="mb-3 rounded border border-rule bg-sheet px-3 py-2 text-sm" data-testid="shared-in-note">
          Shared from <strong>{lib.owner.name}</strong> ({lib.owner.slug}), read-only: use its blocks here; they are published there.
        </p>
      )}
      {lib.requireReview && (
        <p className="mb-3 text-sm text-graphite">
          New revisions of this library count once approved; until then they are listed as awaiting review and designs cannot use them. A
          reviewer or an owner approves one here, never its author.
        </p>
      )}

      {publishing && (
        <PublishForm ws={ws} lib={lib} initial={publishing} onCancel={() => setPublishing(null)}
          onDone={async () => { setPublishing(null); await mutate(); }} />
      )}

      {lib.blocks.length === 0 && <p className="rounded border border-rule bg-sheet px-3 py-8 text-center text-graphite">No blocks yet.</p>}
      {lib.blocks.map((b) => (
        <section key={b.name} className="mb-6" aria-label={`Block ${b.name}`}>
          <div className="mb-2 flex flex-wrap items-baseline gap-3">
            <h2 className="font-mono text-lg font-semibold">{b.name}</h2>
            <span className="text-sm text-graphite">
              {b.latest ? <>latest <span className="font-mono">r{b.latest}</span> · use it with <code className="font-mono text-ink">use {b.name} from &quot;{lib.ref}&quot; at {b.latest}</code></> : "no revision counts yet"}
            </span>
            {lib.mayPublish && !publishing && (
              <button type="button" onClick={() => void startPublish(b.name)} className="ml-auto rounded border border-rule px-2 py-1 text-xs hover:border-ink">
                Publish a new revision
              </button>
            )}
          </div>
          <div className="overflow-x-auto rounded border border-rule bg-sheet">
            <table className="w-full text-sm" data-testid={`revisions-${b.name}`}>
              <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
                <tr>
                  <th className="px-3 py-2">Rev.</th>
                  <th className="px-3 py-2">State</th>
                  <th className="px-3 py-2">What changed</th>
                  <th className="px-3 py-2">Ports</th>
                  <th className="px-3 py-2">Family</th>
                  <th className="px-3 py-2 text-right">Gates</th>
                  <th className="px-3 py-2 text-right">Depth</th>
                  <th className="px-3 py-2 text-right">Packages</th>
                  <th className="px-3 py-2 text-right">Delay (est.)</th>
                  <th className="px-3 py-2 text-right">Power (est.)</th>
                  <th className="px-3 py-2">Used by</th>
                  <th className="px-3 py-2" aria-label="Source" />
                </tr>
              </thead>
              <tbody className="tabular">
                {b.revisions.map((r) => {
                  const s = r.stats;
                  const open = shown?.block === b.name && shown.number === r.number;
                  const power = s.staticMw == null && s.dynamicMw == null ? null : (s.staticMw ?? 0) + (s.dynamicMw ?? 0);
                  return (
                    <Fragment key={r.id}>
                      <tr className="border-b border-rule/60 align-top last:border-0" data-testid={`revision-${b.name}-${r.number}`}>
                        <td className="px-3 py-2 font-mono">r{r.number}</td>
                        <td className="px-3 py-2">
                          <span className={`rounded px-1.5 py-0.5 text-xs ${r.state === "published" ? "bg-accent/15 text-accent" : "bg-amber/15 text-amber"}`}>{r.state}</span>
                          {s.verified === true && <div className="mt-0.5 text-xs text-graphite" title="the netlist was proved equal to the block's function">verified</div>}
                          {r.state === "awaiting review" && mayApprove && (
                            <Approve url={`${url}/blocks/${encodeURIComponent(b.name)}/revisions/${r.number}/approval`} onDone={() => void mutate()} />
                          )}
                        </td>
                        <td className="px-3 py-2">
                          {r.message}
                          <div className="text-xs text-graphite">{r.author.name} · {fmtWhen(r.createdAt)}</div>
                          {r.deltas && <DeltaLine r={r} />}
                        </td>
                        <td className="px-3 py-2 font-mono text-xs">({r.inputs.join(", ")}) → ({r.outputs.join(", ")})</td>
                        <td className="px-3 py-2 text-xs text-graphite">{r.family.name}</td>
                        <td className="px-3 py-2 text-right font-mono">{fmtInt(s.gates)}</td>
                        <td className="px-3 py-2 text-right font-mono">{fmtInt(s.depth)}</td>
                        <td className="px-3 py-2 text-right font-mono">{typeof s.packages === "number" ? s.packages : "—"}</td>
                        <td className="px-3 py-2 text-right font-mono">{fmtNs(s.delayNs)}</td>
                        <td className="px-3 py-2 text-right font-mono">{fmtMw(power)}</td>
                        <td className="px-3 py-2 text-xs" data-testid={`used-by-${b.name}-${r.number}`}>
                          {r.usedBy && r.usedBy.length > 0 ? (
                            <ul>
                              {r.usedBy.map((u) => (
                                <li key={u.design.id}>
                                  <Link href={`/w/${ws}/d/${u.design.id}`} className="text-ink hover:text-accent">{u.design.name}</Link>{" "}
                                  <span className="font-mono text-graphite">{u.revisions.map((n) => `r${n}`).join(", ")}</span>
                                </li>
                              ))}
                            </ul>
                          ) : (
                            <span className="text-graphite">—</span>
                          )}
                        </td>
                        <td className="px-3 py-2 text-right">
                          <button type="button" onClick={() => setShown(open ? null : { block: b.name, number: r.number })}
                            className="text-xs text-graphite hover:text-ink" aria-expanded={open}>
                            {open ? "Hide source" : "Source"}
                          </button>
                        </td>
                      </tr>
                      {open && (
                        <tr className="border-b border-rule/60">
                          <td colSpan={12} className="px-3 py-2">
                            <div className="flex flex-wrap items-start gap-6">
                              <div className="min-w-[24rem] flex-1"><RevisionSource url={`${url}/blocks/${encodeURIComponent(b.name)}/revisions/${r.number}`} /></div>
                              {r.deltas && <FigureDeltas deltas={r.deltas} fromLabel="before" toLabel={`r${r.number}`} />}
                            </div>
                          </td>
                        </tr>
                      )}
                    </Fragment>
                  );
                })}
              </tbody>
            </table>
          </div>
        </section>
      ))}
      <p className="mb-6 text-xs text-graphite">
        Figures were computed when each revision was published, under the family named beside it. Delay and power are estimates from the
        family&apos;s typical figures; check the parts&apos; data sheets and your own design rules.
      </p>

      {!lib.sharedIn && <Shares ws={ws} lib={lib} mayShare={mayShare} onChanged={() => void mutate()} />}
    </div>
  );
}

function DeltaLine({ r }: { r: LibraryRevisionItem }) {
  const parts = (r.deltas ?? []).filter((d) => d.delta !== null && d.delta !== 0 && (d.figure === "gates" || d.figure === "depth" || d.figure === "delayNs"));
  if (parts.length === 0) return <div className="text-xs text-graphite">same gates, depth and delay as the revision before</div>;
  return (
    <div className="text-xs">
      {parts.map((d, i) => (
        <span key={d.figure} className={d.delta! < 0 ? "text-accent" : "text-vermilion"}>
          {i > 0 ? ", " : ""}
          {d.label} {d.delta! > 0 ? "+" : "−"}{Math.abs(d.delta!)}{d.unit === "ns" ? " ns" : ""}
        </span>
      ))}
      <span className="text-graphite"> against the revision before</span>
    </div>
  );
}

/** Approves a revision awaiting review, with an optional note of what was checked (the server refuses its author). */
function Approve({ url, onDone }: { url: string; onDone: () => void }) {
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    setBusy(true);
    try {
      await api(url, { method: "POST", json: note.trim() ? { note: note.trim() } : {} });
      setOpen(false);
      onDone();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  }
  if (!open) {
    return (
      <button type="button" onClick={() => setOpen(true)} className="mt-1 block rounded border border-rule px-1.5 py-0.5 text-xs hover:border-ink">
        Approve…
      </button>
    );
  }
  return (
    <form onSubmit={(e) => void submit(e)} className="mt-1 flex w-56 flex-col gap-1" aria-label="Approve this revision">
      <input value={note} onChange={(e) => setNote(e.target.value)} placeholder="what you checked (optional)" aria-label="Approval note"
        className="rounded border border-rule bg-paper px-1.5 py-0.5 text-xs" />
      <div className="flex gap-1">
        <button type="submit" disabled={busy} className="rounded bg-accent px-2 py-0.5 text-xs font-semibold text-paper disabled:opacity-50">Approve</button>
        <button type="button" onClick={() => setOpen(false)} className="rounded border border-rule px-2 py-0.5 text-xs">Cancel</button>
      </div>
      {error && <p role="alert" className="text-xs text-vermilion">{error}</p>}
    </form>
  );
}

function RevisionSource({ url }: { url: string }) {
  const { data, error } = useSWR<{ revision: Revision }>(url);
  if (error) return <p className="text-vermilion">{error.message}</p>;
  if (!data) return <p className="text-graphite">Loading…</p>;
  return <pre className="overflow-x-auto rounded bg-paper p-3 font-mono text-xs" data-testid="revision-source">{data.revision.source}</pre>;
}

function PublishForm({ ws, lib, initial, onCancel, onDone }: {
  ws: string;
  lib: LibraryItem;
  initial: { block: string; source: string };
  onCancel: () => void;
  onDone: () => Promise<void>;
}) {
  const { data: families } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  const [block, setBlock] = useState(initial.block);
  const [source, setSource] = useState(initial.source);
  const [familyId, setFamilyId] = useState<string>("");
  const [message, setMessage] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [serverDiagnostics, setServerDiagnostics] = useState<Diagnostic[] | null>(null);
  const check = useMemo(() => checkLibraryBlock(source), [source]);
  const errors = check.diagnostics.filter((d) => d.severity === "error");
  const family = familyId || families?.items.find((f) => f.key === "cmos-hc-5v")?.id || families?.items[0]?.id || "";

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    setServerDiagnostics(null);
    setBusy(true);
    try {
      await api(`/api/v1/workspaces/${ws}/libraries/${lib.id}/blocks/${encodeURIComponent(block.trim())}/revisions`, {
        method: "POST",
        json: { source, familyId: family, settings: {}, message: message.trim() || "Published from the library page" },
      });
      await onDone();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
      if (err instanceof ApiError) setServerDiagnostics(((err.details as { diagnostics?: Diagnostic[] } | null)?.diagnostics) ?? null);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="mb-6 rounded border border-accent/50 bg-sheet p-3" aria-label="Publish a block revision">
      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
        <label htmlFor="publish-block" className="font-semibold">Block</label>
        <input id="publish-block" value={block} onChange={(e) => setBlock(e.target.value)} list="library-blocks" required
          placeholder="name, e.g. sluice_vote" className="w-48 rounded border border-rule bg-paper px-2 py-1 font-mono" />
        <datalist id="library-blocks">{lib.blocks.map((b) => <option key={b.name} value={b.name} />)}</datalist>
        <label htmlFor="publish-family" className="font-semibold">Figures for</label>
        <select id="publish-family" value={family} onChange={(e) => setFamilyId(e.target.value)} className="rounded border border-rule bg-paper px-2 py-1">
          {families?.items.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
        </select>
        <label htmlFor="publish-message" className="font-semibold">What changed</label>
        <input id="publish-message" value={message} onChange={(e) => setMessage(e.target.value)} required
          placeholder="e.g. the stop also sounds the alarm" className="min-w-[16rem] flex-1 rounded border border-rule bg-paper px-2 py-1" />
      </div>
      <div data-testid="publish-editor">
        <EquationEditor value={source} onChange={setSource} diagnostics={serverDiagnostics ?? check.diagnostics} height="16rem" ariaLabel="Block source" />
      </div>
      <p className="mt-1 text-xs text-graphite">
        {errors.length
          ? `${errors.length} error${errors.length === 1 ? "" : "s"}: ${errors[0]!.message} (line ${errors[0]!.line})`
          : `Ports: (${check.inputs.join(", ")}) → (${check.outputs.join(", ")}). The block's inputs are the parameters of a call, its outputs the results; never lines travel with it.`}
      </p>
      {error && <p role="alert" className="mt-1 text-sm text-vermilion">{error}</p>}
      <div className="mt-2 flex gap-2">
        <button type="submit" disabled={busy || errors.length > 0 || !block.trim()} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
          {busy ? "Publishing…" : "Publish"}
        </button>
        <button type="button" onClick={onCancel} className="rounded border border-rule px-3 py-1.5 text-sm">Cancel</button>
        {lib.requireReview && <span className="self-center text-xs text-graphite">It will wait for an approved review before designs can use it.</span>}
      </div>
    </form>
  );
}

function Shares({ ws, lib, mayShare, onChanged }: { ws: string; lib: LibraryItem; mayShare: boolean; onChanged: () => void }) {
  const [slug, setSlug] = useState("");
  const [error, setError] = useState<string | null>(null);
  const base = `/api/v1/workspaces/${ws}/libraries/${lib.id}/shares`;
  async function run(p: Promise<unknown>) {
    setError(null);
    try {
      await p;
      setSlug("");
      onChanged();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : String(e));
    }
  }
  return (
    <section aria-label="Sharing" className="max-w-2xl">
      <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite">Shared with other workspaces (read-only)</h2>
      {(lib.shares ?? []).length === 0 ? (
        <p className="text-sm text-graphite">Only this workspace uses it.</p>
      ) : (
        <ul className="mb-2 text-sm" data-testid="shares">
          {lib.shares!.map((s) => (
            <li key={s.workspace.slug} className="flex items-center gap-2">
              <span>{s.workspace.name}</span> <code className="font-mono text-xs text-graphite">{s.workspace.slug}</code>
              <span className="text-xs text-graphite">since {fmtWhen(s.createdAt)}, by {s.by.name}</span>
              {mayShare && (
                <button type="button" className="ml-auto text-xs text-graphite hover:text-vermilion"
                  onClick={() => void run(api(`${base}/${encodeURIComponent(s.workspace.slug)}`, { method: "DELETE" }))}>
                  Stop sharing
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {mayShare && (
        <form className="flex items-center gap-2 text-sm" onSubmit={(e) => { e.preventDefault(); void run(api(base, { method: "POST", json: { workspace: slug.trim() } })); }}>
          <input value={slug} onChange={(e) => setSlug(e.target.value)} placeholder="the other workspace's address, e.g. weir-controls" aria-label="Workspace to share with"
            className="w-72 rounded border border-rule bg-paper px-2 py-1 font-mono" />
          <button type="submit" disabled={!slug.trim()} className="rounded border border-rule px-3 py-1 disabled:opacity-50">Share</button>
        </form>
      )}
      <p className="mt-1 text-xs text-graphite">Members of a workspace it is shared with write it as <code className="font-mono">&quot;{lib.owner.slug}/{lib.key}&quot;</code>; they use its blocks and never publish to it.</p>
      {error && <p role="alert" className="text-sm text-vermilion">{error}</p>}
    </section>
  );
}
