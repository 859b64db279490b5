"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import type { DesignItem, FamilyItem, Page, WorkspaceInfo } from "@/lib/client/types";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import { fmtInt, fmtNs, fmtWhen } from "./format";

type SortKey = "name" | "updated" | "gates" | "depth" | "delay";
const columns: Array<{ key: SortKey | null; label: string; numeric?: boolean }> = [
  { key: "name", label: "Design" },
  { key: null, label: "Family" },
  { key: null, label: "Revision" },
  { key: "gates", label: "Gates", numeric: true },
  { key: "depth", label: "Depth", numeric: true },
  { key: "delay", label: "Delay (est.)", numeric: true },
  { key: null, label: "Author" },
  { key: "updated", label: "Updated" },
];

/** The workspace's designs: search, sort, filter by family, create, rename and archive. */
export function DesignTable({ ws }: { ws: string }) {
  const [q, setQ] = useState("");
  const [sort, setSort] = useState<SortKey>("updated");
  const [order, setOrder] = useState<"asc" | "desc">("desc");
  const [family, setFamily] = useState("");
  const [archived, setArchived] = useState(false);
  const [creating, setCreating] = useState(false);
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: families } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  const params = new URLSearchParams({ sort, order, archived: archived ? "1" : "0", limit: "100" });
  if (q.trim()) params.set("q", q.trim());
  const key = `/api/v1/workspaces/${ws}/designs?${params}`;
  const { data, error, mutate, isLoading } = useSWR<Page<DesignItem>>(key);
  const role = wsData?.workspace.role;
  const mayEdit = role ? can(role, "design.edit") : false;
  const rows = (data?.items ?? []).filter((d) => !family || d.family.id === family);

  function sortBy(k: SortKey) {
    if (k === sort) setOrder(order === "asc" ? "desc" : "asc");
    else {
      setSort(k);
      setOrder(k === "name" ? "asc" : "desc");
    }
  }

  const [renaming, setRenaming] = useState<string | null>(null);
  const [rowError, setRowError] = useState<{ id: string; message: string } | null>(null);

  async function patch(d: DesignItem, json: Record<string, unknown>) {
    setRowError(null);
    try {
      await api(`/api/v1/workspaces/${ws}/designs/${d.id}`, { method: "PATCH", json });
      await mutate();
      return true;
    } catch (e) {
      setRowError({ id: d.id, message: e instanceof ApiError ? e.message : String(e) });
      return false;
    }
  }

  async function rename(d: DesignItem, name: string) {
    const next = name.trim();
    if (!next || next === d.name || (await patch(d, { name: next }))) setRenaming(null);
  }

  return (
    <section>
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-xl font-semibold">Designs</h1>
        <input
          type="search"
          value={q}
          onChange={(e) => setQ(e.target.value)}
          placeholder="Search names and descriptions"
          aria-label="Search designs"
          className="w-64 rounded border border-rule bg-sheet px-3 py-1.5 text-sm outline-none focus:border-accent"
        />
        <select
          value={family}
          onChange={(e) => setFamily(e.target.value)}
          aria-label="Filter by family"
          className="rounded border border-rule bg-sheet px-2 py-1.5 text-sm"
        >
          <option value="">All families</option>
          {families?.items.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name}
            </option>
          ))}
        </select>
        <label className="flex items-center gap-1.5 text-sm text-graphite">
          <input type="checkbox" checked={archived} onChange={(e) => setArchived(e.target.checked)} />
          Archived
        </label>
        {mayEdit && (
          <button
            type="button"
            onClick={() => setCreating(true)}
            className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper hover:opacity-90"
          >
            New design
          </button>
        )}
      </div>
      {creating && families && (
        <NewDesignForm
          ws={ws}
          families={families.items}
          onDone={async (id) => {
            setCreating(false);
            if (id) window.location.assign(`/w/${ws}/d/${id}`);
          }}
        />
      )}
      {error && <p role="alert" className="text-sm text-vermilion">{error.message}</p>}
      <div className="overflow-x-auto rounded border border-rule bg-sheet">
        <table className="w-full text-sm" data-testid="design-table">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
            <tr>
              {columns.map((c) => (
                <th key={c.label} className={`px-3 py-2 font-semibold ${c.numeric ? "text-right" : ""}`}
                  aria-sort={c.key === sort ? (order === "asc" ? "ascending" : "descending") : undefined}>
                  {c.key ? (
                    <button type="button" onClick={() => sortBy(c.key!)} className="uppercase hover:text-ink">
                      {c.label}
                      {c.key === sort ? (order === "asc" ? " ↑" : " ↓") : ""}
                    </button>
                  ) : (
                    c.label
                  )}
                </th>
              ))}
              {mayEdit && <th className="px-3 py-2" aria-label="Actions" />}
            </tr>
          </thead>
          <tbody className="tabular">
            {rows.map((d) => {
              const s = d.latestRevision?.stats;
              return (
                <tr key={d.id} className="border-b border-rule/60 last:border-0 hover:bg-paper">
                  <td className="px-3 py-2">
                    {renaming === d.id ? (
                      <form onSubmit={(e) => { e.preventDefault(); void rename(d, String(new FormData(e.currentTarget).get("name") ?? "")); }}>
                        <input name="name" defaultValue={d.name} autoFocus aria-label={`New name for ${d.name}`}
                          onKeyDown={(e) => e.key === "Escape" && setRenaming(null)}
                          className="w-full rounded border border-accent bg-paper px-2 py-0.5 text-sm" />
                      </form>
                    ) : (
                      <Link href={`/w/${ws}/d/${d.id}`} className="font-semibold text-ink hover:text-accent">
                        {d.name}
                      </Link>
                    )}
                    {d.description && <div className="text-xs text-graphite">{d.description}</div>}
                    {rowError?.id === d.id && <div role="alert" className="text-xs text-vermilion">{rowError.message}</div>}
                  </td>
                  <td className="px-3 py-2 text-graphite">{d.family.name}</td>
                  <td className="px-3 py-2 font-mono">{d.latestRevision ? `r${d.latestRevision.number}` : "draft"}</td>
                  <td className="px-3 py-2 text-right font-mono">{fmtInt(s?.gates)}</td>
                  <td className="px-3 py-2 text-right font-mono">{fmtInt(s?.depth)}</td>
                  <td className="px-3 py-2 text-right font-mono">{fmtNs(s?.delayNs as number | null | undefined)}</td>
                  <td className="px-3 py-2 text-graphite">{d.latestRevision?.author.name ?? d.createdBy.name}</td>
                  <td className="px-3 py-2 text-graphite">{fmtWhen(d.updatedAt)}</td>
                  {mayEdit && (
                    <td className="whitespace-nowrap px-3 py-2 text-right text-xs">
                      <button type="button" onClick={() => setRenaming(d.id)} className="text-graphite hover:text-ink">
                        Rename
                      </button>
                      <span className="mx-1 text-rule">|</span>
                      <button type="button" onClick={() => void patch(d, { archived: !d.archivedAt })} className="text-graphite hover:text-ink">
                        {d.archivedAt ? "Restore" : "Archive"}
                      </button>
                    </td>
                  )}
                </tr>
              );
            })}
            {!isLoading && rows.length === 0 && (
              <tr>
                <td colSpan={columns.length + 1} className="px-3 py-8 text-center text-graphite">
                  {q || family ? "No design matches." : archived ? "No archived designs." : "No designs yet."}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-graphite">
        Delays are estimates from each family&apos;s typical figures; check the parts&apos; data sheets and your design rules.
      </p>
    </section>
  );
}

function NewDesignForm({ ws, families, onDone }: { ws: string; families: FamilyItem[]; onDone: (id: string | null) => void }) {
  const [error, setError] = useState<string | null>(null);
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    try {
      const res = await api<{ design: { id: string } }>(`/api/v1/workspaces/${ws}/designs`, {
        method: "POST",
        json: {
          name: String(f.get("name") ?? "").trim(),
          description: String(f.get("description") ?? "").trim(),
          familyId: String(f.get("familyId")),
        },
      });
      onDone(res.design.id);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : String(err));
    }
  }
  return (
    <form onSubmit={submit} className="mb-4 grid gap-3 rounded border border-rule bg-sheet p-4 sm:grid-cols-[1fr_1fr_1.5fr_auto]">
      <input name="name" required placeholder="Name, e.g. weir sluice interlock" aria-label="Design name"
        className="rounded border border-rule bg-paper px-3 py-1.5 text-sm" autoFocus />
      <select name="familyId" aria-label="Logic family" className="rounded border border-rule bg-paper px-2 py-1.5 text-sm">
        {families.filter((f) => !f.archivedAt).map((f) => (
          <option key={f.id} value={f.id}>
            {f.name}
          </option>
        ))}
      </select>
      <input name="description" placeholder="What it does (optional)" aria-label="Description"
        className="rounded border border-rule bg-paper px-3 py-1.5 text-sm" />
      <div className="flex gap-2">
        <button type="submit" className="rounded bg-accent px-3 py-1.5 text-sm font-semibold text-paper">Create</button>
        <button type="button" onClick={() => onDone(null)} className="rounded border border-rule px-3 py-1.5 text-sm">Cancel</button>
      </div>
      {error && <p role="alert" className="text-sm text-vermilion sm:col-span-4">{error}</p>}
    </form>
  );
}
