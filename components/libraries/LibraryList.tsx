"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { LibraryItem, WorkspaceInfo } from "@/lib/client/types";

/** The libraries a workspace may use: its own (with a form for a new one) and those shared with it. */
export function LibraryList({ ws }: { ws: string }) {
  const { data: wsData, mutate: mutateWs } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data, error, mutate } = useSWR<{ items: LibraryItem[] }>(`/api/v1/workspaces/${ws}/libraries`);
  const [creating, setCreating] = useState(false);
  const role = wsData?.workspace.role;
  const mayCreate = role ? can(role, "library.edit") : false;
  const isOwner = role ? can(role, "workspace.settings") : false;
  const own = data?.items.filter((l) => !l.sharedIn) ?? [];
  const shared = data?.items.filter((l) => l.sharedIn) ?? [];

  return (
    <section>
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-xl font-semibold">Libraries</h1>
        {mayCreate && (
          <button type="button" onClick={() => setCreating(true)} className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90">
            New library
          </button>
        )}
      </div>
      <p className="mb-4 max-w-3xl text-sm text-graphite">
        Proven blocks, published as revisions that never change. A design brings one in with a line such as{" "}
        <code className="font-mono text-ink">use vote2of3 from &quot;lock-blocks&quot; at 2</code> and calls it like a block of its own; the
        revision it names stays pinned until you change the number.
      </p>
      {isOwner && wsData && <ReviewSetting ws={ws} settings={wsData.workspace.settings ?? {}} onChanged={() => void Promise.all([mutateWs(), mutate()])} />}
      {creating && (
        <NewLibraryForm ws={ws} onDone={async (id) => {
          setCreating(false);
          if (id) window.location.assign(`/w/${ws}/libraries/${id}`);
        }} />
      )}
      {error && <p role="alert" className="text-sm text-vermilion">{error.message}</p>}
      <LibraryTable ws={ws} items={own} empty={data ? "This workspace has no libraries yet." : "Loading…"} testId="library-table" />
      {shared.length > 0 && (
        <>
          <h2 className="mb-2 mt-6 text-sm font-semibold uppercase tracking-wide text-graphite">Shared with this workspace (read-only)</h2>
          <LibraryTable ws={ws} items={shared} empty="" testId="shared-library-table" />
        </>
      )}
    </section>
  );
}

function LibraryTable({ ws, items, empty, testId }: { ws: string; items: LibraryItem[]; empty: string; testId: string }) {
  return (
    <div className="overflow-x-auto rounded border border-rule bg-sheet">
      <table className="w-full text-sm" data-testid={testId}>
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
          <tr>
            <th className="px-3 py-2 font-semibold">Library</th>
            <th className="px-3 py-2 font-semibold">Written in use lines</th>
            <th className="px-3 py-2 font-semibold">Blocks (latest revision and ports)</th>
          </tr>
        </thead>
        <tbody>
          {items.map((l) => (
            <tr key={l.id} className="border-b border-rule/60 align-top last:border-0 hover:bg-paper">
              <td className="px-3 py-2">
                <Link href={`/w/${ws}/libraries/${l.id}`} className="font-semibold text-ink hover:text-accent">{l.name}</Link>
                {l.description && <div className="text-xs text-graphite">{l.description}</div>}
                {l.sharedIn && <div className="text-xs text-graphite">from {l.owner.name}</div>}
              </td>
              <td className="px-3 py-2 font-mono">&quot;{l.ref}&quot;</td>
              <td className="px-3 py-2">
                {l.blocks.length === 0 ? (
                  <span className="text-graphite">no blocks yet</span>
                ) : (
                  <ul className="space-y-0.5 font-mono text-xs">
                    {l.blocks.map((b) => {
                      const latest = b.revisions.find((r) => r.number === b.latest);
                      return (
                        <li key={b.name}>
                          <span className="font-semibold text-ink">{b.name}</span>
                          {latest ? ` r${latest.number} (${latest.inputs.join(", ")}) → (${latest.outputs.join(", ")})` : " — awaiting review"}
                          <span className="text-graphite"> · {b.revisions.length} revision{b.revisions.length === 1 ? "" : "s"}</span>
                        </li>
                      );
                    })}
                  </ul>
                )}
              </td>
            </tr>
          ))}
          {items.length === 0 && empty && (
            <tr>
              <td colSpan={3} className="px-3 py-8 text-center text-graphite">{empty}</td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}

function ReviewSetting({ ws, settings, onChanged }: { ws: string; settings: Record<string, unknown>; onChanged: () => void }) {
  const [error, setError] = useState<string | null>(null);
  const on = settings.requireReviewToPublish === true;
  async function toggle(next: boolean) {
    setError(null);
    try {
      await api(`/api/v1/workspaces/${ws}`, { method: "PATCH", json: { settings: { requireReviewToPublish: next } } });
      onChanged();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : String(e));
    }
  }
  return (
    <div className="mb-4 rounded border border-rule bg-sheet px-3 py-2 text-sm">
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={on} onChange={(e) => void toggle(e.target.checked)} data-testid="require-review" />
        A new block revision counts only once a review approves it
      </label>
      <p className="ml-6 text-xs text-graphite">
        Until then it is listed as awaiting review, and designs cannot use it; a reviewer or an owner, never its author, approves it on the
        library&apos;s page. (Owners set this.)
      </p>
      {error && <p role="alert" className="text-xs text-vermilion">{error}</p>}
    </div>
  );
}

function NewLibraryForm({ ws, onDone }: { ws: string; onDone: (id: string | null) => void }) {
  const [error, setError] = useState<string | null>(null);
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    try {
      const res = await api<{ library: { id: string } }>(`/api/v1/workspaces/${ws}/libraries`, {
        method: "POST",
        json: { name: String(f.get("name") ?? "").trim(), key: String(f.get("key") ?? "").trim(), description: String(f.get("description") ?? "").trim() },
      });
      onDone(res.library.id);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
    }
  }
  return (
    <form onSubmit={submit} className="mb-4 grid gap-3 rounded border border-rule bg-sheet p-4 sm:grid-cols-[1fr_1fr_1.5fr_auto]">
      <input name="name" required placeholder="Name, e.g. Weir blocks" aria-label="Library name" autoFocus
        className="rounded border border-rule bg-paper px-3 py-1.5 text-sm" />
      <input name="key" required placeholder="Key for use lines, e.g. weir-blocks" aria-label="Library key" pattern="[a-z0-9][a-z0-9\-]{0,63}"
        title="lower-case letters, digits and dashes" className="rounded border border-rule bg-paper px-3 py-1.5 font-mono text-sm" />
      <input name="description" placeholder="What it holds (optional)" aria-label="Description"
        className="rounded border border-rule bg-paper px-3 py-1.5 text-sm" />
      <div className="flex gap-2">
        <button type="submit" className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper">Create</button>
        <button type="button" onClick={() => onDone(null)} className="rounded border border-rule px-3 py-1.5 text-sm">Cancel</button>
      </div>
      {error && <p role="alert" className="text-sm text-vermilion sm:col-span-4">{error}</p>}
    </form>
  );
}
