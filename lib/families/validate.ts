/**
 * Checks a user's family without zod so that every layer (CLI, API, web) can
 * call it. It takes any parsed JSON, never throws, and returns every problem
 * found, each saying what to change.
 */
import type { Family, FigureKey } from "./types";
import { GATE_TYPES, MAX_FAN_OUT, MAX_GATE_WIDTH, MAX_PER_PACKAGE } from "./types";
import { deriveFamily } from "./derive";
import { FIGURES, rangeText } from "./figures";

export interface FamilyProblem {
  field: string;
  message: string;
}

const TECHNOLOGIES = ["bipolar", "cmos", "other"];

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const isNum = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
const isWhole = (v: unknown): v is number => typeof v === "number" && Number.isInteger(v);
const show = (v: unknown) => {
  try {
    const s = JSON.stringify(v);
    return s === undefined ? String(v) : s.length > 40 ? `${s.slice(0, 37)}...` : s;
  } catch {
    return String(v);
  }
};

/**
 * Problems with a family description; an empty list means it can be used.
 * Accepts any value (parsed JSON from a request or a file). Widths are capped
 * at MAX_GATE_WIDTH inputs, perPackage at MAX_PER_PACKAGE, fanOut at
 * MAX_FAN_OUT. A family that leaves fanOut unset must have figures that give
 * a derived fan-out of at least 2.
 */
export function validateFamily(input: unknown): FamilyProblem[] {
  const out: FamilyProblem[] = [];
  const add = (field: string, message: string) => out.push({ field, message });
  if (!isObject(input)) {
    add("", `a family must be an object of named figures, not ${show(input)}`);
    return out;
  }
  const f = input as Record<string, unknown>;
  if (typeof f.id !== "string" || !/^[a-z0-9][a-z0-9-]{0,62}$/.test(f.id)) {
    add("id", "id must be 1–63 lower-case letters, digits or dashes, starting with a letter or digit");
  }
  if (typeof f.name !== "string" || f.name.trim() === "") add("name", "give the family a name");
  if (f.technology !== undefined && !TECHNOLOGIES.includes(f.technology as string)) add("technology", `technology must be one of ${TECHNOLOGIES.join(", ")}`);
  if (f.description !== undefined && typeof f.description !== "string") add("description", "description must be text");

  // A figure that is present but not a finite number is reported once, and later checks skip it.
  const figure = (k: string, what = k): number | undefined => {
    const v = f[k];
    if (v === undefined) return undefined;
    if (!isNum(v)) {
      add(k, `${what} must be a number, not ${show(v)}`);
      return undefined;
    }
    return v;
  };
  const fig: Partial<Record<FigureKey, number>> = {};
  for (const spec of FIGURES) {
    const v = figure(spec.key, `${spec.symbol} (${spec.label}) in ${spec.unit}`);
    if (v === undefined) continue;
    const m = spec.signed ? Math.abs(v) : v;
    const low = spec.minExclusive ? m <= spec.min : m < spec.min;
    if (low || m > spec.max) add(spec.key, `${spec.symbol} (${spec.label}) must be ${rangeText(spec)}; got ${v}`);
    else fig[spec.key] = v;
  }
  if (f.fanIn !== undefined && (!isWhole(f.fanIn) || f.fanIn < 2 || f.fanIn > MAX_GATE_WIDTH)) {
    add("fanIn", `the fan-in limit (fanIn) must be a whole number of inputs from 2 to ${MAX_GATE_WIDTH}; got ${show(f.fanIn)}`);
  }
  if (f.fanOut !== undefined && (!isWhole(f.fanOut) || f.fanOut < 2 || f.fanOut > MAX_FAN_OUT)) {
    add("fanOut", `the fan-out (fanOut) must be a whole number of unit loads from 2 to ${MAX_FAN_OUT} (a buffer must be able to drive more than one load); got ${show(f.fanOut)}`);
  }
  const { vohMin, volMax, vihMin, vilMax, supplyV } = fig;
  if (vohMin !== undefined && vihMin !== undefined && vohMin <= vihMin) {
    add("vohMin", `VOH(min) must be above VIH(min), or the family cannot drive its own inputs high: VOH(min) ${vohMin} V, VIH(min) ${vihMin} V`);
  }
  if (volMax !== undefined && vilMax !== undefined && volMax >= vilMax) {
    add("volMax", `VOL(max) must be below VIL(max), or the family cannot drive its own inputs low: VOL(max) ${volMax} V, VIL(max) ${vilMax} V`);
  }
  if (vilMax !== undefined && vihMin !== undefined && vilMax >= vihMin) add("vilMax", `VIL(max) must be below VIH(min): VIL(max) ${vilMax} V, VIH(min) ${vihMin} V`);
  if (supplyV !== undefined && vohMin !== undefined && vohMin > supplyV) add("vohMin", `VOH(min) ${vohMin} V cannot exceed the supply voltage ${supplyV} V`);
  if (supplyV !== undefined && vihMin !== undefined && vihMin > supplyV) add("vihMin", `VIH(min) ${vihMin} V cannot exceed the supply voltage ${supplyV} V, or no input could ever read a high`);

  if (f.ratedDrive !== undefined) {
    const r = f.ratedDrive;
    if (!isObject(r)) add("ratedDrive", "ratedDrive must be an object with iohMa, iolMa, vohMin, volMax and source");
    else {
      const RATED = { iohMa: "IOH", iolMa: "IOL", vohMin: "VOH(min)", volMax: "VOL(max)" } as const;
      for (const k of ["iohMa", "iolMa", "vohMin", "volMax"] as const) {
        const spec = FIGURES.find((x) => x.key === k)!;
        const v = r[k];
        const m = isNum(v) ? (spec.signed ? Math.abs(v) : v) : NaN;
        if (!isNum(v) || m < spec.min || m > spec.max) {
          add(`ratedDrive.${k}`, `the rated point's ${RATED[k]} must be a number ${rangeText(spec)}; got ${show(v)}`);
        }
      }
      if (typeof r.source !== "string") add("ratedDrive.source", "ratedDrive.source must say where the rated point comes from");
      if (vohMin !== undefined && isNum(r.vohMin) && r.vohMin > vohMin) add("ratedDrive.vohMin", "the rated point's VOH(min) cannot exceed the light-load VOH(min)");
    }
  }

  let gatesOk = true;
  if (f.gates !== undefined) {
    if (!Array.isArray(f.gates)) {
      add("gates", "gates must be a list");
      gatesOk = false;
    } else {
      const seen = new Set<string>();
      f.gates.forEach((g: unknown, i) => {
        const at = `gates[${i}]`;
        if (!isObject(g)) {
          add(at, `each gate must be an object with a type and widths, not ${show(g)}`);
          gatesOk = false;
          return;
        }
        const type = g.type;
        if (typeof type !== "string" || !(GATE_TYPES as readonly string[]).includes(type)) {
          add(`${at}.type`, `gate type must be one of ${GATE_TYPES.join(", ")}`);
          gatesOk = false;
        } else if (seen.has(type)) {
          add(`${at}.type`, `${type} is listed twice; give all its widths in one entry`);
          gatesOk = false;
        } else seen.add(type);
        const single = type === "NOT" || type === "BUF";
        if (!Array.isArray(g.widths) || g.widths.length === 0) {
          add(`${at}.widths`, "give at least one width");
          gatesOk = false;
          return;
        }
        g.widths.forEach((w: unknown, j) => {
          const wat = `${at}.widths[${j}]`;
          if (!isObject(w)) {
            add(wat, `each width must be an object with width and perPackage, not ${show(w)}`);
            gatesOk = false;
            return;
          }
          const ok = single ? w.width === 1 : isWhole(w.width) && w.width >= 2 && w.width <= MAX_GATE_WIDTH;
          if (!ok) {
            add(`${wat}.width`, single ? "NOT and BUF have width 1" : `widths must be whole numbers from 2 to ${MAX_GATE_WIDTH}`);
            gatesOk = false;
          }
          if (!isWhole(w.perPackage) || w.perPackage < 1 || w.perPackage > MAX_PER_PACKAGE) {
            add(`${wat}.perPackage`, `perPackage must be a whole number from 1 to ${MAX_PER_PACKAGE}`);
            gatesOk = false;
          }
        });
      });
    }
  }

  if (f.transistors !== undefined) {
    if (!isObject(f.transistors)) add("transistors", "transistors must map gate types to { base, perInput }");
    else
      for (const [type, m] of Object.entries(f.transistors)) {
        const at = `transistors.${type}`;
        if (!(GATE_TYPES as readonly string[]).includes(type)) add(at, `${type} is not a gate type; use ${GATE_TYPES.join(", ")}`);
        if (!isObject(m)) {
          add(at, "give { base, perInput }: transistors for an n-input gate are base + perInput · n");
          continue;
        }
        for (const k of ["base", "perInput"] as const) {
          if (!isNum(m[k]) || m[k] < 0) add(`${at}.${k}`, `${at}.${k} must be a number of at least 0`);
        }
      }
  }

  if (f.sources !== undefined) {
    if (!isObject(f.sources)) add("sources", "sources must map figure names to text");
    else for (const [k, v] of Object.entries(f.sources)) if (typeof v !== "string") add(`sources.${k}`, `sources.${k} must be text`);
  }

  // The mapper needs a fan-out of at least 2; a family that leaves it to its currents must give one.
  const fanInOk = f.fanIn === undefined || (isWhole(f.fanIn) && f.fanIn >= 2 && f.fanIn <= MAX_GATE_WIDTH);
  if (f.fanOut === undefined && gatesOk && fanInOk) {
    const d = deriveFamily({ id: "check", name: "check", ...fig } as Family);
    const v = d.fanOut.value;
    if (v !== null && v < 2) {
      const low = [d.dcFanOut, d.acFanOut].filter((x) => x.value !== null && x.value < 2);
      const parts = low.map((x) => (x === d.dcFanOut ? `DC ${d.dcFanOutLow.formula}; ${d.dcFanOutHigh.formula}` : `AC ${x.formula}`));
      add(
        "fanOut",
        `the figures give a derived fan-out of ${v} (${d.fanOut.formula}; ${parts.join("; ")}), and mapping needs at least 2: ` +
          "set fanOut in the family, or fix IOL/IIL/IOH/IIH (or the output resistance, transition limit and input capacitance)",
      );
    }
  }
  return out;
}
