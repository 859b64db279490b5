/**
 * Design settings: which family, which gate form, which cost model and the
 * electrical assumptions of the analysis. A plain type for the pure core,
 * and a zod schema (zod is pure) for the API and forms.
 */
import { z } from "zod";
import { TARGET_FORMS, type TargetForm } from "../map/mapper";

export type CostKind = "products" | "gate-inputs" | "fan-in";
/** Which structure a revision keeps: the two-level covers mapped as they are, or the factored multi-level network (lib/factor). */
export type Structure = "two-level" | "factored";
/** What the factored structure minimizes first: gates (then packages, then levels) or levels (then gates, then packages). */
export type Aim = "gates" | "levels";

/**
 * What a design asks of the pipeline besides its family. The family travels
 * apart, as a Family object in the pipeline and as a family record id
 * ("familyId") in the API and the database.
 */
export interface DesignSettings {
  /** Target gate form; default "and-or". "or-and" and "nor" minimize to POS, the others to SOP. */
  form?: TargetForm;
  /** Minimizer cost model (CostModel in lib/minimize); default "products": the products that need a gate (a term of one literal is a wire), then literals. "fan-in" uses the mapping fan-in. */
  cost?: CostKind;
  /** Widest gate input allowed; default the family's. */
  fanIn?: number;
  /** Fan-out in unit loads; default the family's. */
  fanOut?: number;
  /** Complemented inputs are available from outside; default false. */
  complementedInputs?: boolean;
  /** Load of each output pin in unit loads; default 1. */
  outputPinLoad?: number;
  /** Clock for dynamic power, MHz; default 10. */
  clockMHz?: number;
  /** Share of cycles in which a net rises; default 0.25 (random data with equal chances of 0 and 1). */
  activity?: number;
  /** Run the heuristic minimizer instead of the exact one; default false. */
  heuristic?: boolean;
  /** Family (id) whose outputs drive the design's inputs; the analysis checks levels and loads there. Default: not checked. */
  inputsDrivenBy?: string;
  /** Family (id) whose inputs the design's outputs drive; checked like inputsDrivenBy. Default: not checked. */
  outputsDrive?: string;
  /**
   * Inverters may take the spare places of NAND, NOR, XOR or XNOR packages
   * already used (other inputs tied) when that saves inverter packages; default true.
   */
  spareInverters?: boolean;
  /**
   * Structure the revision keeps: "two-level" (default) maps the minimized
   * covers as they are; "factored" maps the multi-level network lib/factor
   * builds from them. The pipeline reports both side by side.
   */
  structure?: Structure;
  /** For the factored structure: fewest "gates" (default) or fewest "levels". */
  aim?: Aim;
}

export const DEFAULT_SETTINGS = {
  form: "and-or" as TargetForm,
  cost: "products" as CostKind,
  complementedInputs: false,
  outputPinLoad: 1,
  clockMHz: 10,
  activity: 0.25,
  heuristic: false,
  spareInverters: true,
  structure: "two-level" as Structure,
  aim: "gates" as Aim,
};

const FAMILY_ID = /^[a-z0-9][a-z0-9-]{0,62}$/;

/** Settings with every default filled in; fanIn and fanOut stay absent when the family's own apply. */
export type ResolvedSettings = Required<Omit<DesignSettings, OptionalSetting>> & Pick<DesignSettings, OptionalSetting>;
/** Settings with no default: absent means the family's own figure, or no check. */
type OptionalSetting = "fanIn" | "fanOut" | "inputsDrivenBy" | "outputsDrive";

/** Fills in the defaults (DEFAULT_SETTINGS); call once, where settings enter (API body, CLI flags, a stored revision). */
export function resolveSettings(s: DesignSettings = {}): ResolvedSettings {
  const out: ResolvedSettings = { ...DEFAULT_SETTINGS };
  for (const k of SETTING_KEYS) {
    const v = s[k];
    if (v !== undefined) (out as unknown as Record<string, unknown>)[k] = v;
  }
  return out;
}

const SETTING_KEYS = ["form", "cost", "fanIn", "fanOut", "complementedInputs", "outputPinLoad", "clockMHz", "activity", "heuristic", "inputsDrivenBy", "outputsDrive", "spareInverters", "structure", "aim"] as const satisfies ReadonlyArray<keyof DesignSettings>;

/** The settings as the API and storage take them (no family: that travels apart as familyId). */
export const designSettingsSchema = z.object({
  form: z.enum(TARGET_FORMS as unknown as [TargetForm, ...TargetForm[]]).optional(),
  cost: z.enum(["products", "gate-inputs", "fan-in"]).optional(),
  fanIn: z.number().int().min(2, "fan-in must be at least 2").max(64).optional(),
  fanOut: z.number().int().min(2, "fan-out must be at least 2").max(10000).optional(),
  complementedInputs: z.boolean().optional(),
  outputPinLoad: z.number().min(0).max(1000).optional(),
  clockMHz: z.number().positive().max(10000).optional(),
  activity: z.number().min(0).max(1).optional(),
  heuristic: z.boolean().optional(),
  inputsDrivenBy: z.string().regex(FAMILY_ID, "give a family's key, e.g. ttl-ls-5v").optional(),
  outputsDrive: z.string().regex(FAMILY_ID, "give a family's key, e.g. ttl-ls-5v").optional(),
  spareInverters: z.boolean().optional(),
  structure: z.enum(["two-level", "factored"]).optional(),
  aim: z.enum(["gates", "levels"]).optional(),
});
