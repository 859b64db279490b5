/**
 * Checks a user's family without zod so that every layer (CLI, API, web) can
 * call it. Returns every problem found, each saying what to change.
 */
import type { Family, FigureKey } from "./types";
import { GATE_TYPES } from "./types";

export interface FamilyProblem {
  field: string;
  message: string;
}

const POSITIVE: FigureKey[] = [
  "supplyV", "inputCapPf", "outputOhms", "maxTransitionNs", "intrinsicNs",
];
const NON_NEGATIVE: FigureKey[] = ["vohMin", "volMax", "vihMin", "vilMax", "wiringPf", "perLoadNs", "staticMaPerGate", "powerCapPf"];
const CURRENTS: FigureKey[] = ["iohMa", "iolMa", "iihMa", "iilMa"];

/** Problems with a family description; an empty list means it can be used. */
export function validateFamily(f: Partial<Family>): FamilyProblem[] {
  const out: FamilyProblem[] = [];
  const add = (field: string, message: string) => out.push({ field, message });
  if (typeof f.id !== "string" || !/^[a-z0-9][a-z0-9-]{0,62}$/.test(f.id)) {
    add("id", "id must be 1–63 lower-case letters, digits or dashes, starting with a letter or digit");
  }
  if (typeof f.name !== "string" || f.name.trim() === "") add("name", "give the family a name");
  const num = (k: string, v: unknown) => {
    if (v === undefined) return false;
    if (typeof v !== "number" || !Number.isFinite(v)) {
      add(k, `${k} must be a number`);
      return false;
    }
    return true;
  };
  for (const k of POSITIVE) if (num(k, f[k]) && f[k]! <= 0) add(k, `${k} must be greater than 0`);
  for (const k of NON_NEGATIVE) if (num(k, f[k]) && f[k]! < 0) add(k, `${k} must not be negative`);
  for (const k of CURRENTS) if (num(k, f[k]) && f[k] === 0) add(k, `${k} must not be 0 (give its magnitude in mA)`);
  if (f.fanIn !== undefined && (!Number.isInteger(f.fanIn) || f.fanIn < 2)) add("fanIn", "fanIn must be a whole number of at least 2");
  if (f.fanOut !== undefined && (!Number.isInteger(f.fanOut) || f.fanOut < 2)) add("fanOut", "fanOut must be a whole number of at least 2 (a buffer must be able to drive more than one load)");
  if (f.vohMin !== undefined && f.vihMin !== undefined && f.vohMin <= f.vihMin) add("vohMin", "VOH(min) must be above VIH(min), or the family cannot drive its own inputs high");
  if (f.volMax !== undefined && f.vilMax !== undefined && f.volMax >= f.vilMax) add("volMax", "VOL(max) must be below VIL(max), or the family cannot drive its own inputs low");
  if (f.vilMax !== undefined && f.vihMin !== undefined && f.vilMax >= f.vihMin) add("vilMax", "VIL(max) must be below VIH(min)");
  if (f.supplyV !== undefined && f.vohMin !== undefined && f.vohMin > f.supplyV) add("vohMin", "VOH(min) cannot exceed the supply voltage");
  if (f.ratedDrive !== undefined) {
    const r = f.ratedDrive;
    for (const k of ["iohMa", "iolMa", "vohMin", "volMax"] as const) {
      if (typeof r[k] !== "number" || !Number.isFinite(r[k]) || r[k] < 0) add(`ratedDrive.${k}`, `ratedDrive.${k} must be a number of at least 0`);
    }
    if (f.vohMin !== undefined && r.vohMin > f.vohMin) add("ratedDrive.vohMin", "the rated point's VOH(min) cannot exceed the light-load VOH(min)");
  }
  if (f.gates !== undefined) {
    if (!Array.isArray(f.gates)) add("gates", "gates must be a list");
    else
      f.gates.forEach((g, i) => {
        if (!GATE_TYPES.includes(g.type)) add(`gates[${i}].type`, `gate type must be one of ${GATE_TYPES.join(", ")}`);
        if (!Array.isArray(g.widths) || g.widths.length === 0) add(`gates[${i}].widths`, "give at least one width");
        else
          g.widths.forEach((w, j) => {
            const single = g.type === "NOT" || g.type === "BUF";
            if (!Number.isInteger(w.width) || w.width < 1 || (!single && w.width < 2) || (single && w.width !== 1))
              add(`gates[${i}].widths[${j}].width`, single ? "NOT and BUF have width 1" : "widths must be whole numbers of at least 2");
            if (!Number.isInteger(w.perPackage) || w.perPackage < 1) add(`gates[${i}].widths[${j}].perPackage`, "perPackage must be a whole number of at least 1");
          });
      });
  }
  return out;
}
