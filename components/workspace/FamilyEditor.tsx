"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import useSWR from "swr";
import { api, ApiError } from "@/lib/client/fetcher";
import { can } from "@/lib/auth/permissions";
import type { FamilyItem, WorkspaceInfo } from "@/lib/client/types";
import {
  deriveFamily,
  FIGURES,
  GATE_TYPES,
  rangeText,
  SOURCE_SUGGESTIONS,
  validateFamily,
  type DerivedFigure,
  type Family,
  type FigureGroup,
  type FigureKey,
  type GateOffer,
  type GateType,
} from "@/lib/families";
import { ConfirmButton } from "@/components/ui/ConfirmButton";

const GROUPS: Array<[FigureGroup, string]> = [
  ["supply", "Supply"],
  ["levels", "Levels"],
  ["currents", "Currents (a minus sign gives only the direction)"],
  ["edges", "Edges and capacitance"],
  ["delay", "Delay model"],
  ["power", "Power"],
];
const RATED = [
  ["iohMa", "IOH", "mA"],
  ["iolMa", "IOL", "mA"],
  ["vohMin", "VOH(min)", "V"],
  ["volMax", "VOL(max)", "V"],
] as const;

/** What the form holds: every number as typed, so a half-typed value is never lost. */
interface Draft {
  key: string;
  name: string;
  technology: "" | "bipolar" | "cmos" | "other";
  description: string;
  figures: Partial<Record<FigureKey, string>>;
  sources: Record<string, string>;
  fanIn: string;
  fanOut: string;
  gates: Array<{ type: GateType; widths: Array<{ width: string; perPackage: string }> }>;
  transistors: Partial<Record<GateType, { base: string; perInput: string }>>;
  rated: { iohMa: string; iolMa: string; vohMin: string; volMax: string; source: string } | null;
}

const str = (v: unknown) => (typeof v === "number" ? String(v) : "");

function draftOf(f: Partial<Family> & { key?: string }, keepIdentity: boolean): Draft {
  const figures: Partial<Record<FigureKey, string>> = {};
  for (const s of FIGURES) if (f[s.key] !== undefined) figures[s.key] = str(f[s.key]);
  const transistors: Draft["transistors"] = {};
  for (const [t, m] of Object.entries(f.transistors ?? {})) if (m) transistors[t as GateType] = { base: str(m.base), perInput: str(m.perInput) };
  return {
    key: keepIdentity ? (f.key ?? f.id ?? "") : "",
    name: keepIdentity ? (f.name ?? "") : "",
    technology: f.technology ?? "",
    description: f.description ?? "",
    figures,
    sources: { ...(f.sources ?? {}) } as Record<string, string>,
    fanIn: str(f.fanIn),
    fanOut: str(f.fanOut),
    gates: (f.gates ?? []).map((g) => ({ type: g.type, widths: g.widths.map((w) => ({ width: str(w.width), perPackage: str(w.perPackage) })) })),
    transistors,
    rated: f.ratedDrive
      ? { iohMa: str(f.ratedDrive.iohMa), iolMa: str(f.ratedDrive.iolMa), vohMin: str(f.ratedDrive.vohMin), volMax: str(f.ratedDrive.volMax), source: f.ratedDrive.source }
      : null,
  };
}

/** A typed number: empty → undefined, text that is no number → NaN (validateFamily then names the field). */
const num = (s: string | undefined): number | undefined => {
  if (s === undefined || s.trim() === "") return undefined;
  const v = Number(s.trim().replace(",", "."));
  return Number.isFinite(v) ? v : (s as unknown as number);
};

/** The family the draft describes, as the API and the pure core take it. */
function familyOf(d: Draft): Family & Record<string, unknown> {
  const f: Family & Record<string, unknown> = { id: d.key || "draft", name: d.name };
  if (d.technology) f.technology = d.technology;
  if (d.description.trim()) f.description = d.description.trim();
  for (const s of FIGURES) {
    const v = num(d.figures[s.key]);
    if (v !== undefined) (f as Record<string, unknown>)[s.key] = v;
  }
  const fanIn = num(d.fanIn);
  const fanOut = num(d.fanOut);
  if (fanIn !== undefined) f.fanIn = fanIn;
  if (fanOut !== undefined) f.fanOut = fanOut;
  if (d.gates.length) f.gates = d.gates.map((g) => ({ type: g.type, widths: g.widths.map((w) => ({ width: num(w.width) as number, perPackage: num(w.perPackage) as number })) }));
  const tr = Object.entries(d.transistors).filter(([, m]) => m && (m.base.trim() || m.perInput.trim()));
  if (tr.length) f.transistors = Object.fromEntries(tr.map(([t, m]) => [t, { base: num(m!.base) ?? 0, perInput: num(m!.perInput) ?? 0 }]));
  if (d.rated) {
    f.ratedDrive = {
      iohMa: num(d.rated.iohMa) as number, iolMa: num(d.rated.iolMa) as number,
      vohMin: num(d.rated.vohMin) as number, volMax: num(d.rated.volMax) as number, source: d.rated.source,
    };
  }
  const sources = Object.fromEntries(Object.entries(d.sources).filter(([, v]) => v.trim() !== ""));
  if (Object.keys(sources).length) f.sources = sources;
  return f;
}

const input = "rounded border border-rule bg-paper px-2 py-1 text-sm disabled:opacity-70";

/**
 * A family's figures, each with its unit, range and source; the derived
 * figures follow as you type. Owners edit the workspace's own families and
 * create new ones (empty or from a copy); everyone else reads.
 */
export function FamilyEditor({ ws, familyId, from }: { ws: string; familyId?: string; from?: string }) {
  const router = useRouter();
  const creating = !familyId;
  const { data: wsData } = useSWR<{ workspace: WorkspaceInfo }>(`/api/v1/workspaces/${ws}`);
  const { data: list } = useSWR<{ items: FamilyItem[] }>(`/api/v1/workspaces/${ws}/families`);
  const { data: one, mutate } = useSWR<{ family: FamilyItem }>(familyId ? `/api/v1/workspaces/${ws}/families/${familyId}` : null);
  const role = wsData?.workspace.role;
  const mayManage = role ? can(role, "family.manage") : false;
  const record = one?.family;
  const editable = mayManage && (creating || (record ? !record.builtin : false));

  const [start, setStart] = useState<string>(from ?? "");
  const [draft, setDraft] = useState<Draft | null>(null);
  const [saved, setSaved] = useState<string>("");
  const [serverError, setServerError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  // Fill the form once the family (or the copy it starts from) has loaded.
  useEffect(() => {
    if (draft) return;
    if (creating) {
      if (!list) return;
      const src = list.items.find((f) => f.id === start);
      const d = src ? draftOf({ ...(src.data as Partial<Family>) }, false) : draftOf({}, false);
      if (src) d.name = `${src.name} (our copy)`;
      setDraft(d);
    } else if (record) {
      const d = draftOf({ ...(record.data as Partial<Family>), key: record.key, name: record.name }, true);
      setDraft(d);
      setSaved(JSON.stringify(familyOf(d)));
    }
  }, [creating, list, record, start, draft]);

  const family = useMemo(() => (draft ? familyOf(draft) : null), [draft]);
  const problems = useMemo(() => (family ? validateFamily({ ...family, id: draft?.key ?? "" }) : []), [family, draft?.key]);
  const byField = useMemo(() => {
    const m: Record<string, string> = { ...(serverError?.fields ?? {}) };
    for (const p of problems) m[p.field] ??= p.message;
    return m;
  }, [problems, serverError]);
  const derived = useMemo(() => (family ? safeDerive(family) : null), [family]);
  const dirty = family ? JSON.stringify(family) !== saved : false;

  if (!draft || !family) return <p className="text-sm text-graphite">Loading the family…</p>;
  const set = (patch: Partial<Draft>) => {
    setServerError(null);
    setNotice(null);
    setDraft({ ...draft, ...patch });
  };
  const setFigure = (k: FigureKey, v: string) => set({ figures: { ...draft.figures, [k]: v } });
  const setSource = (k: string, v: string) => set({ sources: { ...draft.sources, [k]: v } });

  async function save() {
    if (!family || !draft) return;
    setBusy(true);
    setServerError(null);
    const { id: _id, name: _name, ...data } = family;
    try {
      if (creating) {
        const r = await api<{ family: FamilyItem }>(`/api/v1/workspaces/${ws}/families`, {
          method: "POST",
          json: { key: draft.key, name: draft.name, data, ...(start ? { copyOf: start } : {}) },
        });
        router.push(`/w/${ws}/families/${r.family.id}`);
      } else {
        await api(`/api/v1/workspaces/${ws}/families/${familyId}`, { method: "PATCH", json: { name: draft.name, data } });
        setSaved(JSON.stringify(family));
        setNotice("Saved. Designs on this family use the new figures from their next compile; saved revisions keep theirs.");
        await mutate();
      }
    } catch (e) {
      if (e instanceof ApiError) {
        const fields: Record<string, string> = {};
        for (const d of (Array.isArray(e.details) ? e.details : []) as Array<{ path?: string; message?: string }>) {
          if (d.path && d.message) fields[d.path.replace(/^data\./, "")] = d.message;
        }
        setServerError({ message: e.message, fields });
      } else setServerError({ message: String(e), fields: {} });
    } finally {
      setBusy(false);
    }
  }

  async function archive(archived: boolean) {
    try {
      await api(`/api/v1/workspaces/${ws}/families/${familyId}`, { method: "PATCH", json: { archived } });
      setNotice(archived ? "Archived: new designs no longer offer this family; designs and revisions on it keep it." : "Restored: new designs offer this family again.");
      await mutate();
    } catch (e) {
      setServerError({ message: e instanceof ApiError ? e.message : String(e), fields: {} });
    }
  }

  const title = creating ? "New family" : draft.name || record?.name || "Family";
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <Link href={`/w/${ws}/families`} className="text-sm text-graphite hover:text-ink">← Families</Link>
        <h1 className="text-xl font-semibold">{title}</h1>
        {record?.builtin && <span className="rounded-full border border-rule px-2 py-0.5 text-xs text-graphite">built-in · read only</span>}
        {record?.archivedAt && <span className="rounded-full border border-amber/60 bg-amber/10 px-2 py-0.5 text-xs text-ink" data-testid="archived-badge">archived</span>}
        <span className="ml-auto flex items-center gap-3 text-sm">
          {mayManage && record && (
            <Link href={`/w/${ws}/families/new?from=${record.id}`} className="rounded border border-rule px-3 py-1.5 hover:border-ink">
              Copy into a new family
            </Link>
          )}
          {editable && !creating && record && (
            record.archivedAt ? (
              <button type="button" onClick={() => void archive(false)} className="rounded border border-rule px-3 py-1.5 hover:border-ink">Restore</button>
            ) : (
              <ConfirmButton label="Archive" confirm="Yes, archive"
                question="Archive this family? New designs will not offer it; designs and revisions on it keep it."
                onConfirm={() => archive(true)} />
            )
          )}
          {editable && (
            <button type="button" onClick={() => void save()} disabled={busy || problems.length > 0 || (!creating && !dirty)}
              className="rounded bg-accent px-3 py-1.5 font-semibold text-paper hover:opacity-90 disabled:opacity-50"
              title={problems.length ? `Fix ${problems.length} problem(s) first` : undefined}>
              {creating ? "Create family" : busy ? "Saving…" : "Save"}
            </button>
          )}
        </span>
      </div>

      {serverError && <p role="alert" className="rounded border border-vermilion/40 bg-vermilion/10 px-3 py-2 text-sm text-vermilion">{serverError.message}</p>}
      {notice && <p role="status" className="rounded border border-accent/40 bg-accent/10 px-3 py-2 text-sm">{notice}</p>}
      {editable && problems.length > 0 && (
        <div role="alert" className="rounded border border-amber/50 bg-amber/10 px-3 py-2 text-sm" data-testid="problems">
          <p className="font-semibold">{problems.length === 1 ? "One figure needs a change" : `${problems.length} figures need a change`} before the family can be saved:</p>
          <ul className="mt-1 list-disc pl-5">
            {problems.slice(0, 8).map((p, i) => <li key={i}>{p.message}</li>)}
          </ul>
        </div>
      )}

      <div className="grid gap-6 xl:grid-cols-[minmax(0,7fr)_minmax(0,4fr)]">
        <div className="space-y-6">
          <section className="grid gap-3 rounded border border-rule bg-sheet p-3 sm:grid-cols-2" aria-label="Identity">
            {creating && (
              <label className="flex flex-col gap-0.5 text-xs text-graphite sm:col-span-2">
                Start from
                <select className={input} value={start} aria-label="Start from"
                  onChange={(e) => {
                    setStart(e.target.value);
                    const src = list?.items.find((f) => f.id === e.target.value);
                    const d = src ? draftOf({ ...(src.data as Partial<Family>) }, false) : draftOf({}, false);
                    setDraft({ ...d, key: draft.key, name: src ? `${src.name} (our copy)` : draft.name });
                  }}>
                  <option value="">An empty family</option>
                  {list?.items.filter((f) => !f.archivedAt).map((f) => <option key={f.id} value={f.id}>A copy of {f.name}</option>)}
                </select>
              </label>
            )}
            <Text label="Name" value={draft.name} disabled={!editable} error={byField.name} onChange={(v) => set({ name: v })} />
            <Text label="Key" value={draft.key} disabled={!editable || !creating} error={creating ? byField.id ?? byField.key : undefined}
              hint="lower-case letters, digits and dashes; designs' settings name the family by it" onChange={(v) => set({ key: v })} />
            <label className="flex flex-col gap-0.5 text-xs text-graphite">
              Technology
              <select className={input} value={draft.technology} disabled={!editable} onChange={(e) => set({ technology: e.target.value as Draft["technology"] })}>
                <option value="">not said</option>
                <option value="bipolar">bipolar</option>
                <option value="cmos">CMOS</option>
                <option value="other">other</option>
              </select>
            </label>
            <Text label="Description" value={draft.description} disabled={!editable} onChange={(v) => set({ description: v })} />
          </section>

          <datalist id="source-suggestions">
            {SOURCE_SUGGESTIONS.map((s) => <option key={s} value={s} />)}
          </datalist>
          {GROUPS.map(([group, heading]) => (
            <section key={group} aria-label={heading}>
              <h2 className="mb-1.5 text-xs font-semibold uppercase tracking-wide text-graphite">{heading}</h2>
              <div className="overflow-x-auto rounded border border-rule bg-sheet">
                <table className="w-full min-w-[44rem] table-fixed text-sm">
                  <colgroup><col className="w-28" /><col /><col className="w-40" /><col className="w-[38%]" /></colgroup>
                  <tbody>
                    {FIGURES.filter((s) => s.group === group).map((s) => (
                      <tr key={s.key} className="border-b border-rule/60 align-top last:border-0" data-figure={s.key}>
                        <td className="px-3 py-1.5 font-mono">{s.symbol}</td>
                        <td className="px-3 py-1.5 text-graphite">{s.label}<div className="text-[11px]">{rangeText({ ...s, signed: false })}{s.signed ? " (magnitude)" : ""}</div></td>
                        <td className="px-3 py-1.5">
                          <span className="flex items-center gap-1">
                            <input type="text" inputMode="decimal" className={`${input} w-24 font-mono ${byField[s.key] ? "border-vermilion" : ""}`}
                              value={draft.figures[s.key] ?? ""} disabled={!editable} placeholder="—"
                              aria-label={`${s.symbol} in ${s.unit}`} aria-invalid={!!byField[s.key]}
                              onChange={(e) => setFigure(s.key, e.target.value)} />
                            <span className="text-xs text-graphite">{s.unit}</span>
                          </span>
                        </td>
                        <td className="px-3 py-1.5">
                          <input type="text" list="source-suggestions" className={`${input} w-full text-xs`} disabled={!editable}
                            value={draft.sources[s.key] ?? ""} placeholder="source: data sheet of part …, measured, estimate"
                            title={draft.sources[s.key] || undefined}
                            aria-label={`Source of ${s.symbol}`} onChange={(e) => setSource(s.key, e.target.value)} />
                          {byField[s.key] && <div role="alert" className="mt-0.5 text-[11px] leading-tight text-vermilion">{byField[s.key]}</div>}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </section>
          ))}

          <section aria-label="Rated output point">
            <h2 className="mb-1.5 text-xs font-semibold uppercase tracking-wide text-graphite">Rated output point (a heavier load, e.g. 4 mA)</h2>
            <div className="rounded border border-rule bg-sheet p-3 text-sm">
              {draft.rated ? (
                <div className="flex flex-wrap items-end gap-3">
                  {RATED.map(([k, sym, unit]) => (
                    <label key={k} className="flex flex-col gap-0.5 text-xs text-graphite">
                      {sym} ({unit})
                      <input type="text" inputMode="decimal" className={`${input} w-20 font-mono ${byField[`ratedDrive.${k}`] ? "border-vermilion" : ""}`}
                        value={draft.rated![k]} disabled={!editable} aria-label={`Rated ${sym} in ${unit}`}
                        onChange={(e) => set({ rated: { ...draft.rated!, [k]: e.target.value } })} />
                    </label>
                  ))}
                  <label className="flex min-w-[14rem] flex-1 flex-col gap-0.5 text-xs text-graphite">
                    Source
                    <input type="text" list="source-suggestions" className={input} value={draft.rated.source} disabled={!editable}
                      aria-label="Source of the rated point" onChange={(e) => set({ rated: { ...draft.rated!, source: e.target.value } })} />
                  </label>
                  {editable && <button type="button" className="pb-1 text-xs text-graphite hover:text-vermilion" onClick={() => set({ rated: null })}>Drop the rated point</button>}
                  {Object.entries(byField).filter(([k]) => k.startsWith("ratedDrive")).map(([k, m]) => <p key={k} role="alert" className="w-full text-xs text-vermilion">{m}</p>)}
                </div>
              ) : editable ? (
                <button type="button" className="text-sm text-accent hover:underline"
                  onClick={() => set({ rated: { iohMa: "", iolMa: "", vohMin: "", volMax: "", source: "" } })}>
                  Add a rated output point
                </button>
              ) : (
                <p className="text-graphite">None given.</p>
              )}
            </div>
          </section>

          <GatesEditor draft={draft} editable={editable} errors={byField} onChange={(gates, transistors) => set({ gates, transistors })}
            onSource={(v) => setSource("gates", v)} />

          <section className="grid gap-3 rounded border border-rule bg-sheet p-3 sm:grid-cols-2" aria-label="Limits set by hand">
            <Text label="Fan-in limit (inputs, optional)" value={draft.fanIn} disabled={!editable} error={byField.fanIn}
              hint="caps the widths on offer" onChange={(v) => set({ fanIn: v })} />
            <Text label="Fan-out (unit loads, optional)" value={draft.fanOut} disabled={!editable} error={byField.fanOut}
              hint="overrides the derived fan-out" onChange={(v) => set({ fanOut: v })} />
          </section>
        </div>

        <aside className="space-y-3 xl:sticky xl:top-4 xl:self-start" aria-label="Derived figures">
          <h2 className="text-xs font-semibold uppercase tracking-wide text-graphite">Derived figures</h2>
          {derived ? (
            <dl className="space-y-2 text-sm" data-testid="derived">
              <Derived id="dcFanOutLow" label="DC fan-out, low state (IOL / IIL)" f={derived.dcFanOutLow} />
              <Derived id="dcFanOutHigh" label="DC fan-out, high state (IOH / IIH)" f={derived.dcFanOutHigh} />
              <Derived id="acFanOut" label="AC fan-out (edge-rate limit, capacitive load)" f={derived.acFanOut} />
              <Derived id="fanOut" label="Fan-out the mapper uses" f={derived.fanOut} />
              <Derived id="fanIn" label="Widest gate on offer" f={derived.fanIn} />
              <Derived id="nmh" label="Noise margin high (own inputs)" f={derived.nmh} digits={2} />
              <Derived id="nml" label="Noise margin low (own inputs)" f={derived.nml} digits={2} />
            </dl>
          ) : (
            <p className="text-sm text-graphite">Not computed: fix the figures marked first.</p>
          )}
          <p className="rounded border border-amber/40 bg-amber/10 px-3 py-2 text-xs">
            Derived figures are estimates from the figures above. Check the data sheets of the parts you use and your own design rules.
          </p>
          <p className="text-xs text-graphite">
            How this family meets the others — margins and inputs fed per output, in both directions — is in the{" "}
            <Link href={`/w/${ws}/families/matrix`} className="text-accent hover:underline">compatibility matrix</Link>.
          </p>
        </aside>
      </div>
    </div>
  );
}

/** The derived figures of what is typed so far; text that is no number stays out of the arithmetic (validateFamily names it). */
function safeDerive(f: Family) {
  const clean: Family & Record<string, unknown> = { ...f };
  for (const s of FIGURES) if (typeof clean[s.key] !== "number") delete clean[s.key];
  if (typeof clean.fanIn !== "number" || !Number.isInteger(clean.fanIn) || clean.fanIn < 2) delete clean.fanIn;
  if (typeof clean.fanOut !== "number" || !Number.isInteger(clean.fanOut) || clean.fanOut < 2) delete clean.fanOut;
  if (clean.gates) {
    const ok = (n: unknown) => typeof n === "number" && Number.isInteger(n) && n >= 1;
    clean.gates = clean.gates
      .map((g: GateOffer) => ({ ...g, widths: g.widths.filter((w) => ok(w.width) && ok(w.perPackage)) }))
      .filter((g: GateOffer) => g.widths.length > 0);
  }
  try {
    return deriveFamily(clean);
  } catch {
    return null;
  }
}

function Derived({ id, label, f, digits = 0 }: { id: string; label: string; f: DerivedFigure; digits?: number }) {
  return (
    <div className="rounded border border-rule bg-sheet px-3 py-2" data-testid={`derived-${id}`}>
      <dt className="flex items-baseline justify-between gap-2">
        <span>{label}</span>
        <span className="font-mono text-base tabular" data-testid={`derived-${id}-value`}>
          {f.value === null ? "—" : `${digits ? f.value.toFixed(digits) : f.value}${f.unit === "V" ? " V" : f.unit === "inputs" ? " inputs" : ""}`}
        </span>
      </dt>
      <dd className="mt-0.5 font-mono text-[11px] leading-tight text-graphite">{f.formula}</dd>
    </div>
  );
}

function Text({ label, value, onChange, disabled, error, hint }: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  disabled?: boolean;
  error?: string;
  hint?: string;
}) {
  return (
    <label className="flex flex-col gap-0.5 text-xs text-graphite">
      {label}
      <input type="text" className={`${input} text-ink ${error ? "border-vermilion" : ""}`} value={value} disabled={disabled}
        aria-invalid={!!error} onChange={(e) => onChange(e.target.value)} />
      {hint && <span className="text-[11px]">{hint}</span>}
      {error && <span role="alert" className="text-[11px] text-vermilion">{error}</span>}
    </label>
  );
}

/** Gate types on offer, each with its widths and how many fit one package, and optional transistor counts. */
function GatesEditor({ draft, editable, errors, onChange, onSource }: {
  draft: Draft;
  editable: boolean;
  errors: Record<string, string>;
  onChange: (gates: Draft["gates"], transistors: Draft["transistors"]) => void;
  onSource: (v: string) => void;
}) {
  const gates = draft.gates;
  const setGates = (g: Draft["gates"]) => onChange(g, draft.transistors);
  const at = (t: GateType) => gates.findIndex((g) => g.type === t);
  return (
    <section aria-label="Gate types">
      <h2 className="mb-1.5 text-xs font-semibold uppercase tracking-wide text-graphite">Gate types, widths and gates per package</h2>
      <div className="overflow-x-auto rounded border border-rule bg-sheet">
        <table className="w-full text-sm" data-testid="gate-offers">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wide text-graphite">
            <tr>
              <th className="px-3 py-1.5">Type</th>
              <th className="px-3 py-1.5">Widths (inputs × gates per package)</th>
              <th className="px-3 py-1.5" title="transistors of an n-input gate = base + per input · n">Transistors: base + per input · n</th>
            </tr>
          </thead>
          <tbody>
            {GATE_TYPES.map((t) => {
              const i = at(t);
              const g = i >= 0 ? gates[i]! : null;
              const single = t === "NOT" || t === "BUF";
              const tr = draft.transistors[t];
              const rowErrors = Object.entries(errors).filter(([k]) => i >= 0 && k.startsWith(`gates[${i}]`));
              return (
                <tr key={t} className="border-b border-rule/60 align-top last:border-0" data-gate-type={t}>
                  <td className="px-3 py-1.5">
                    <label className="flex items-center gap-2 font-mono">
                      <input type="checkbox" checked={!!g} disabled={!editable} aria-label={`Offer ${t}`}
                        onChange={(e) => setGates(e.target.checked
                          ? [...gates, { type: t, widths: [{ width: single ? "1" : "2", perPackage: single ? "6" : "4" }] }]
                          : gates.filter((x) => x.type !== t))} />
                      {t}
                    </label>
                  </td>
                  <td className="px-3 py-1.5">
                    {g ? (
                      <div className="flex flex-wrap items-center gap-2">
                        {g.widths.map((w, j) => (
                          <span key={j} className="inline-flex items-center gap-1 rounded border border-rule px-1.5 py-0.5">
                            <input type="text" inputMode="numeric" className="w-9 bg-transparent text-right font-mono" value={w.width}
                              disabled={!editable || single} aria-label={`${t} width ${j + 1}`}
                              onChange={(e) => setGates(gates.map((x, k) => k !== i ? x : { ...x, widths: x.widths.map((y, m) => m === j ? { ...y, width: e.target.value } : y) }))} />
                            <span className="text-graphite">×</span>
                            <input type="text" inputMode="numeric" className="w-9 bg-transparent font-mono" value={w.perPackage}
                              disabled={!editable} aria-label={`${t} gates per package at width ${w.width}`}
                              onChange={(e) => setGates(gates.map((x, k) => k !== i ? x : { ...x, widths: x.widths.map((y, m) => m === j ? { ...y, perPackage: e.target.value } : y) }))} />
                            {editable && g.widths.length > 1 && (
                              <button type="button" aria-label={`Drop ${t} width ${w.width}`} className="text-graphite hover:text-vermilion"
                                onClick={() => setGates(gates.map((x, k) => k !== i ? x : { ...x, widths: x.widths.filter((_, m) => m !== j) }))}>×</button>
                            )}
                          </span>
                        ))}
                        {editable && !single && (
                          <button type="button" className="text-xs text-accent hover:underline"
                            onClick={() => {
                              const next = Math.max(1, ...g.widths.map((w) => Number(w.width) || 1)) + 1;
                              setGates(gates.map((x, k) => k !== i ? x : { ...x, widths: [...x.widths, { width: String(next), perPackage: "1" }] }));
                            }}>
                            + width
                          </button>
                        )}
                      </div>
                    ) : (
                      <span className="text-graphite">not offered</span>
                    )}
                    {rowErrors.map(([k, m]) => <div key={k} role="alert" className="text-[11px] text-vermilion">{m}</div>)}
                  </td>
                  <td className="px-3 py-1.5">
                    <span className="inline-flex items-center gap-1 font-mono">
                      <input type="text" inputMode="numeric" className={`${input} w-12`} value={tr?.base ?? ""} placeholder="—" disabled={!editable}
                        aria-label={`${t} transistors base`}
                        onChange={(e) => onChange(gates, { ...draft.transistors, [t]: { base: e.target.value, perInput: tr?.perInput ?? "" } })} />
                      +
                      <input type="text" inputMode="numeric" className={`${input} w-12`} value={tr?.perInput ?? ""} placeholder="—" disabled={!editable}
                        aria-label={`${t} transistors per input`}
                        onChange={(e) => onChange(gates, { ...draft.transistors, [t]: { base: tr?.base ?? "", perInput: e.target.value } })} />
                      · n
                    </span>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-1 text-xs text-graphite">
        With no gate type ticked, every type is offered at widths 2 up to the fan-in limit (4 when none is set), one per package.
        Source of the gate list: <input type="text" list="source-suggestions" className={`${input} ml-1 w-72 text-xs`} disabled={!editable}
          value={draft.sources.gates ?? ""} aria-label="Source of the gate types"
          onChange={(e) => onSource(e.target.value)} />
      </p>
    </section>
  );
}
