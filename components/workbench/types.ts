/** What the workbench receives from POST /api/v1/compile. */
import type { Diagnostic } from "@/lib/lang";
import type { MinimizeResult } from "@/lib/minimize/types";
import type { Analysis } from "@/lib/analysis";
import type { NetlistDocument } from "@/lib/export/json";
import type { TargetForm } from "@/lib/map/mapper";
import type { CostKind } from "@/lib/pipeline/settings";

export type { Diagnostic, MinimizeResult, Analysis, NetlistDocument, TargetForm, CostKind };

/** The design settings the workbench edits (the family travels separately). */
export interface WorkbenchSettings {
  form?: TargetForm;
  cost?: CostKind;
  fanIn?: number;
  fanOut?: number;
  complementedInputs?: boolean;
  outputPinLoad?: number;
  clockMHz?: number;
  heuristic?: boolean;
}

export interface CompileResponse {
  diagnostics: Diagnostic[];
  result: {
    covers: MinimizeResult;
    netlist: NetlistDocument;
    analysis: Analysis;
    warnings: string[];
    stats: Record<string, unknown>;
  } | null;
  family?: { id: string; key: string; name: string };
}
