"use client";
import { memo, useEffect, useState } from "react";
import type { FamilyItem } from "@/lib/client/types";
import type { CostKind, TargetForm, WorkbenchSettings } from "./types";

const forms: Array<[TargetForm, string]> = [
  ["and-or", "AND–OR"],
  ["nand", "NAND–NAND"],
  ["or-and", "OR–AND"],
  ["nor", "NOR–NOR"],
  ["mixed", "Mixed"],
];
const costs: Array<[CostKind, string, string]> = [
  [
    "products",
    "Products, then literals",
    "Fewest product terms that need a gate, then fewest literals. A term of one literal is a wire (or an inverter), not a gate, so it is not counted among the products.",
  ],
  ["gate-inputs", "Gate inputs", "Fewest gate inputs: the literals of every product, plus one OR input for each product an output uses."],
  ["fan-in", "Fan-in aware", "Fewest gates when no gate may have more inputs than the fan-in: wide products and sums count the gates they split into."],
];

const field = "rounded border border-rule bg-paper px-2 py-1 text-sm disabled:opacity-70";

/** Family, target form, cost model and the electrical assumptions of one design. */
function SettingsBarView({ families, familyId, onFamily, settings, onChange, readOnly }: {
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
  return (
    <div className="flex flex-wrap items-end gap-x-4 gap-y-2 text-xs text-graphite" data-testid="settings">
      <label className="flex flex-col gap-0.5">
        Family
        <select className={field} value={familyId ?? ""} disabled={readOnly} onChange={(e) => onFamily(e.target.value)}>
          {families.filter((f) => !f.archivedAt || f.id === familyId).map((f) => (
            <option key={f.id} value={f.id}>{f.name}{f.archivedAt ? " (archived)" : ""}</option>
          ))}
        </select>
      </label>
      <Boundary label="Inputs driven by" aria="Family driving the inputs" value={settings.inputsDrivenBy} families={families}
        readOnly={readOnly} onValue={(v) => set("inputsDrivenBy", v)} />
      <Boundary label="Outputs drive" aria="Family the outputs drive" value={settings.outputsDrive} families={families}
        readOnly={readOnly} onValue={(v) => set("outputsDrive", v)} />
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
          title={costs.find(([v]) => v === (settings.cost ?? "products"))?.[2]}
          onChange={(e) => set("cost", e.target.value as CostKind)}>
          {costs.map(([v, l, d]) => <option key={v} value={v} title={d}>{l}</option>)}
        </select>
      </label>
      <NumberField label="Fan-in" aria="Fan-in override" width="w-16" readOnly={readOnly}
        placeholder={fam ? String(fam.fanIn) : ""} value={settings.fanIn} rule={RULES.fanIn}
        onValue={(v) => set("fanIn", v)} />
      <NumberField label="Fan-out" aria="Fan-out override" width="w-16" readOnly={readOnly}
        placeholder={fam ? String(fam.fanOut) : ""} value={settings.fanOut} rule={RULES.fanOut}
        onValue={(v) => set("fanOut", v)} />
      <NumberField label="Pin load" aria="Output pin load in unit loads" width="w-16" readOnly={readOnly}
        placeholder="1" value={settings.outputPinLoad} rule={RULES.outputPinLoad}
        onValue={(v) => set("outputPinLoad", v)} />
      <NumberField label="Clock MHz" aria="Clock for power, MHz" width="w-20" readOnly={readOnly}
        placeholder="10" value={settings.clockMHz} rule={RULES.clockMHz}
        onValue={(v) => set("clockMHz", v)} />
      <label className="flex items-center gap-1.5 pb-1">
        <input type="checkbox" disabled={readOnly} checked={settings.complementedInputs ?? false}
          onChange={(e) => set("complementedInputs", e.target.checked || undefined)} />
        Complemented inputs available
      </label>
      <label className="flex items-center gap-1.5 pb-1" title="Inverters go into unused places of NAND, NOR, XOR or XNOR packages already on the board (other inputs tied) when that saves inverter packages">
        <input type="checkbox" disabled={readOnly} checked={settings.spareInverters ?? true}
          onChange={(e) => set("spareInverters", e.target.checked ? undefined : false)} />
        Spare gates as inverters
      </label>
      <label className="flex items-center gap-1.5 pb-1">
        <input type="checkbox" disabled={readOnly} checked={settings.heuristic ?? false}
          onChange={(e) => set("heuristic", e.target.checked || undefined)} />
        Heuristic only
      </label>
    </div>
  );
}

/** A family at the design's edge, by key; "not checked" leaves that boundary alone. */
function Boundary({ label, aria, value, families, readOnly, onValue }: {
  label: string;
  aria: string;
  value: string | undefined;
  families: FamilyItem[];
  readOnly: boolean;
  onValue: (v: string | undefined) => void;
}) {
  return (
    <label className="flex flex-col gap-0.5" title="the analysis checks levels and loads where the design meets this family">
      {label}
      <select className={`${field} max-w-[14rem]`} value={value ?? ""} disabled={readOnly} aria-label={aria}
        onChange={(e) => onValue(e.target.value || undefined)}>
        <option value="">not checked</option>
        {families.filter((f) => !f.archivedAt || f.key === value).map((f) => (
          <option key={f.id} value={f.key}>{f.name}</option>
        ))}
      </select>
    </label>
  );
}

interface Rule {
  min: number;
  max: number;
  integer: boolean;
  /** What to type instead, said in the field's own terms. */
  message: string;
}

/** The same bounds the server's settings schema enforces, said in the designer's terms. */
const RULES: Record<"fanIn" | "fanOut" | "outputPinLoad" | "clockMHz", Rule> = {
  fanIn: { min: 2, max: 64, integer: true, message: "Fan-in is a whole number of gate inputs from 2 to 64." },
  fanOut: { min: 2, max: 10000, integer: true, message: "Fan-out is a whole number of unit loads, at least 2." },
  outputPinLoad: { min: 0, max: 1000, integer: false, message: "Pin load is in unit loads, from 0 to 1000." },
  clockMHz: { min: 0.000001, max: 10000, integer: false, message: "The clock is in MHz, above 0 and at most 10 000." },
};

/**
 * A numeric override: empty means "the family's figure". What the designer
 * types stays in the field even when it is not valid yet; only valid values
 * reach the settings, and the field says what to type instead.
 */
function NumberField({ label, aria, width, readOnly, placeholder, value, rule, onValue }: {
  label: string;
  aria: string;
  width: string;
  readOnly: boolean;
  placeholder: string;
  value: number | undefined;
  rule: Rule;
  onValue: (v: number | undefined) => void;
}) {
  const [text, setText] = useState(value === undefined ? "" : String(value));
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    // A value set from outside (a loaded design) replaces what is shown, unless the text already means it.
    setText((t) => (t.trim() !== "" && Number(t) === value ? t : value === undefined ? "" : String(value)));
  }, [value]);
  return (
    <label className="flex flex-col gap-0.5">
      {label}
      <input type="text" inputMode="decimal" className={`${field} ${width} ${error ? "border-vermilion" : ""}`}
        disabled={readOnly} placeholder={placeholder} value={text} aria-label={aria} aria-invalid={!!error}
        title={error ?? undefined}
        onChange={(e) => {
          const t = e.target.value;
          setText(t);
          if (t.trim() === "") {
            setError(null);
            onValue(undefined);
            return;
          }
          const v = Number(t);
          const ok = Number.isFinite(v) && v >= rule.min && v <= rule.max && (!rule.integer || Number.isInteger(v));
          setError(ok ? null : rule.message);
          if (ok) onValue(v);
        }} />
      {error && <span role="alert" className="max-w-[12rem] text-[11px] leading-tight text-vermilion">{error}</span>}
    </label>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const SettingsBar = memo(SettingsBarView);
