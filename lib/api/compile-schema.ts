/**
 * The compile answer's shape as a zod schema: the route registry describes it
 * in OpenAPI, and the workbench takes its types from it (z.infer), so there is
 * no hand-written copy to drift. The pipeline's own types must fit it: a
 * change there that the schema does not follow fails the type check below.
 */
import { z } from "zod";
import type { libraryUseBody, resultBody } from "../runtime/compile";

const GateType = z.enum(["AND", "OR", "NAND", "NOR", "XOR", "XNOR", "NOT", "BUF"]);
const Cube = z.object({ value: z.number(), mask: z.number() });

export const Diagnostic = z.object({
  severity: z.enum(["error", "warning"]),
  message: z.string(),
  line: z.number(),
  column: z.number(),
  endLine: z.number(),
  endColumn: z.number(),
});

const Covers = z.object({
  inputs: z.array(z.string()),
  outputs: z.array(z.object({
    name: z.string(),
    form: z.enum(["sop", "pos"]),
    cubes: z.array(Cube),
    expression: z.string(),
    products: z.number(),
    literals: z.number(),
    exact: z.boolean(),
    lowerBound: z.number(),
  })),
  shared: z.number(),
  exact: z.boolean(),
  ms: z.number(),
  cost: z.number(),
  lowerBound: z.number(),
  primes: z.number(),
  route: z.enum(["exact", "heuristic"]),
});

const NetlistDocument = z.object({
  inputs: z.array(z.string()),
  complementedInputs: z.array(z.object({ input: z.string(), net: z.string() })).optional(),
  outputs: z.array(z.object({ name: z.string(), net: z.string() })),
  gates: z.array(z.object({ id: z.string(), type: GateType, inputs: z.array(z.string()), output: z.string() })),
  stats: z.object({
    gates: z.number(),
    byType: z.partialRecord(GateType, z.number()),
    packages: z.number().nullable(),
    transistors: z.number().nullable(),
    depth: z.number(),
    criticalPathNs: z.number().nullable(),
    staticMw: z.number().nullable(),
    dynamicMw: z.number().nullable(),
    maxLoad: z.number(),
  }),
  warnings: z.array(z.string()),
  caution: z.string(),
});

const Estimate = z.object({ value: z.number().nullable(), unit: z.string(), formula: z.string(), caution: z.string(), note: z.string().optional() });

const Named = z.object({ id: z.string(), name: z.string() });
/** Where the design meets the family named by settings.inputsDrivenBy or settings.outputsDrive. */
const BoundaryCheck = z.object({
  side: z.enum(["inputs", "outputs"]),
  driver: Named,
  receiver: Named,
  verdict: z.enum(["compatible", "small-margin", "not-compatible", "unknown"]),
  nmhV: z.number().nullable(),
  nmlV: z.number().nullable(),
  fanOutHigh: z.number().nullable(),
  fanOutLow: z.number().nullable(),
  perOutput: z.number().nullable(),
  load: z.number(),
  at: z.string(),
  formulas: z.array(z.string()),
  messages: z.array(z.string()),
  caution: z.string(),
});

const Analysis = z.object({
  gates: z.number(),
  byType: z.partialRecord(GateType, z.number()),
  byTypeWidth: z.array(z.object({ type: GateType, width: z.number(), count: z.number(), perPackage: z.number().nullable(), packages: z.number().nullable() })),
  packages: z.number().nullable(),
  packagesNote: z.string().optional(),
  transistors: z.number().nullable(),
  transistorsNote: z.string().optional(),
  depth: z.number(),
  criticalPath: z.object({ nets: z.array(z.string()), gates: z.array(z.string()), levels: z.number(), delay: Estimate }),
  staticPower: Estimate,
  dynamicPower: Estimate,
  loads: z.array(z.object({ net: z.string(), load: z.number(), limit: z.number(), status: z.enum(["ok", "at-limit", "over"]), driver: z.string() })),
  maxLoad: z.number(),
  /** Empty when the settings name no family at the design's edges (and in results kept from before it existed). */
  boundaries: z.array(BoundaryCheck).default([]),
  warnings: z.array(z.string()),
  caution: z.string(),
});

export const RevisionStats = z.object({
  inputs: z.number(),
  outputs: z.number(),
  products: z.number(),
  literals: z.number(),
  shared: z.number(),
  exact: z.boolean(),
  cost: z.number(),
  lowerBound: z.number(),
  gates: z.number(),
  depth: z.number(),
  delayNs: z.number().nullable(),
  packages: z.number().nullable(),
  transistors: z.number().nullable(),
  staticMw: z.number().nullable(),
  dynamicMw: z.number().nullable(),
  maxLoad: z.number(),
  fanOut: z.number().nullable().describe("the fan-out limit maxLoad is held against, unit loads"),
  verified: z.boolean(),
  byOutput: z.array(z.object({ name: z.string(), products: z.number(), literals: z.number(), exact: z.boolean() })),
  structure: z.enum(["two-level", "factored"]).describe("the structure the figures and the netlist belong to (settings.structure)"),
});

/** One structure's figures; delay and power are estimates from the family's typical data. */
const StructureFigures = z.object({
  structure: z.enum(["two-level", "factored"]),
  kept: z.boolean().describe("the structure the netlist, analysis and stats of this answer belong to"),
  built: z.enum(["decomposed", "algebraic", "two-level"]).optional()
    .describe("for the factored structure: the construction kept (two-level when factoring found nothing better by the aim)"),
  gates: z.number(),
  levels: z.number(),
  packages: z.number().nullable(),
  transistors: z.number().nullable(),
  delayNs: z.number().nullable(),
  staticMw: z.number().nullable(),
  dynamicMw: z.number().nullable(),
  verified: z.boolean(),
});

export const CompileResultBody = z.object({
  covers: Covers,
  netlist: NetlistDocument,
  analysis: Analysis,
  verification: z.object({ ok: z.boolean(), method: z.enum(["exhaustive", "sat"]) }).nullable(),
  warnings: z.array(z.string()),
  stats: RevisionStats,
  structures: z.array(StructureFigures)
    .describe("the two-level structure's figures and, beside it, the factored one's; kept marks the one settings.structure chose"),
});

const Range = z.object({ line: z.number(), column: z.number(), endLine: z.number(), endColumn: z.number() });
const FigureDelta = z.object({
  figure: z.enum(["gates", "depth", "packages", "delayNs", "powerMw"]),
  label: z.string(),
  unit: z.string(),
  from: z.number().nullable(),
  to: z.number().nullable(),
  delta: z.number().nullable().describe("to − from; lower is better for each figure"),
});

/** A library block revision a compile used, and the newer revision it could move to. */
export const LibraryUse = z.object({
  library: z.string().describe("as the use line writes it"),
  libraryName: z.string(),
  libraryId: z.string(),
  block: z.string(),
  revision: z.number(),
  inputs: z.array(z.string()),
  outputs: z.array(z.string()),
  range: Range.describe("the use line"),
  revisionRange: Range.describe("the revision number on the use line"),
  stats: z.record(z.string(), z.unknown()).describe("the figures stored with this block revision"),
  newer: z.object({
    number: z.number(),
    message: z.string(),
    inputs: z.array(z.string()),
    outputs: z.array(z.string()),
    deltas: z.array(FigureDelta).describe("moving to the newer revision, from the figures stored with both (estimates for delay and power)"),
    portChange: z.string().nullable().describe("what changes for the calls, when the ports differ"),
  }).nullable().describe("the newest revision that may be used, when newer than this one"),
});

export const CompileResponse = z.object({
  diagnostics: z.array(Diagnostic),
  /** Library blocks the use lines brought in. */
  libraries: z.array(LibraryUse),
  /** null when the source has errors (see diagnostics). */
  result: CompileResultBody.nullable(),
  family: z.object({ id: z.string(), key: z.string(), name: z.string() }),
  /** The result came from an earlier identical compile in this workspace. */
  cached: z.boolean(),
});

export type CompileResponse = z.infer<typeof CompileResponse>;
export type CompileResultBody = z.infer<typeof CompileResultBody>;
export type StructureFigures = z.infer<typeof StructureFigures>;
export type LibraryUseBody = z.infer<typeof LibraryUse>;

// The pipeline's result must fit the schema: this line fails the type check when they drift apart.
type Fits<A extends B, B> = A;
export type _ResultFitsSchema = Fits<ReturnType<typeof resultBody>, z.input<typeof CompileResultBody>>;
export type _LibraryUseFitsSchema = Fits<ReturnType<typeof libraryUseBody>, z.input<typeof LibraryUse>>;
