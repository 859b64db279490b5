/** What the workbench receives from POST /api/v1/compile. */
import type { Diagnostic } from "@/lib/lang";
import type { MinimizeResult } from "@/lib/minimize/types";
import type { Analysis } from "@/lib/analysis";
import type { NetlistDocument } from "@/lib/export/json";
import type { TargetForm } from "@/lib/map/mapper";
import type { CostKind, DesignSettings } from "@/lib/pipeline/settings";

export type { Diagnostic, MinimizeResult, Analysis, NetlistDocument, TargetForm, CostKind };

/** The design settings the workbench edits: the pipeline's, less the family (it travels separately) and the activity factor. */
export type WorkbenchSettings = Omit<DesignSettings, "activity">;

/** What POST /api/v1/compile answers: the registry's schema, inferred (no copy kept by hand). */
export type { CompileResponse } from "@/lib/api/compile-schema";
