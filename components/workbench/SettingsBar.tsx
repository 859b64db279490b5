"use client";
import type { FamilyItem } from "@/lib/client/types";
import type { CostKind, TargetForm, WorkbenchSettings } from "./types";

const forms: Array<[TargetForm, string]> = [
  ["and-or", "AND–OR"],
  ["nand", "NAND–NAND"],
  ["or-and", "OR–AND"],
  ["nor", "NOR–NOR"],
  ["mixed", "Mixed"],
];
const costs: Array<[CostKind, string]> = [
  ["products", "Products, then literals"],
  ["gate-inputs", "Gate inputs"],
  ["fan-in", "Fan-in aware"],
];

const field = "rounded border border-rule bg-paper px-2 py-1 text-sm disabled:opacity-70";

/** Family, target form, cost model and the electrical assumptions of one design. */
export function SettingsBar({ families, familyId, onFamily, settings, onChange, readOnly }: {
  families: FamilyItem[];
  familyId: string | undefined;
  onFamily: (id: string) => void;
  settings: WorkbenchSettings;
  onChange: (s: WorkbenchSettings) => void;
  readOnly: boolean;
}) {
  const fam = families.find((f) => f.id === familyId);
  const set = <K extends keyof WorkbenchSettings>(k: K, v: WorkbenchSettings[K]) => {
    const next = { ...settings };
    if (v === undefined || (typeof v === "number" && Number.isNaN(v))) delete next[k];
    else next[k] = v;
    onChange(next);
  };
  const num = (v: string) => (v.trim() === "" ? undefined : Number(v));
  return (
    <div className="flex flex-wrap items-end gap-x-4 gap-y-2 text-xs text-graphite" data-testid="settings">
      <label className="flex flex-col gap-0.5">
        Family
        <select className={field} value={familyId ?? ""} disabled={readOnly} onChange={(e) => onFamily(e.target.value)}>
          {families.map((f) => (
            <option key={f.id} value={f.id}>{f.name}</option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-0.5">
        Target form
        <select className={field} value={settings.form ?? "and-or"} disabled={readOnly}
          onChange={(e) => set("form", e.target.value as TargetForm)}>
          {forms.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
        </select>
      </label>
      <label className="flex flex-col gap-0.5">
        Cost model
        <select className={field} value={settings.cost ?? "products"} disabled={readOnly}
          onChange={(e) => set("cost", e.target.value as CostKind)}>
          {costs.map(([v, l]) => <option key={v} value={v}>{l}</option>)}
        </select>
      </label>
      <label className="flex flex-col gap-0.5">
        Fan-in
        <input type="number" min={2} max={64} className={`${field} w-16`} disabled={readOnly}
          placeholder={fam ? String(fam.fanIn) : ""} value={settings.fanIn ?? ""}
          onChange={(e) => set("fanIn", num(e.target.value))} aria-label="Fan-in override" />
      </label>
      <label className="flex flex-col gap-0.5">
        Fan-out
        <input type="number" min={2} max={1000} className={`${field} w-16`} disabled={readOnly}
          placeholder={fam ? String(fam.fanOut) : ""} value={settings.fanOut ?? ""}
          onChange={(e) => set("fanOut", num(e.target.value))} aria-label="Fan-out override" />
      </label>
      <label className="flex flex-col gap-0.5">
        Pin load
        <input type="number" min={0} step={0.5} className={`${field} w-16`} disabled={readOnly}
          placeholder="1" value={settings.outputPinLoad ?? ""}
          onChange={(e) => set("outputPinLoad", num(e.target.value))} aria-label="Output pin load in unit loads" />
      </label>
      <label className="flex flex-col gap-0.5">
        Clock MHz
        <input type="number" min={0.001} step="any" className={`${field} w-20`} disabled={readOnly}
          placeholder="10" value={settings.clockMHz ?? ""}
          onChange={(e) => set("clockMHz", num(e.target.value))} aria-label="Clock for power, MHz" />
      </label>
      <label className="flex items-center gap-1.5 pb-1">
        <input type="checkbox" disabled={readOnly} checked={settings.complementedInputs ?? false}
          onChange={(e) => set("complementedInputs", e.target.checked || undefined)} />
        Complemented inputs available
      </label>
      <label className="flex items-center gap-1.5 pb-1">
        <input type="checkbox" disabled={readOnly} checked={settings.heuristic ?? false}
          onChange={(e) => set("heuristic", e.target.checked || undefined)} />
        Heuristic only
      </label>
    </div>
  );
}
