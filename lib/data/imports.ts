import "server-only";
/**
 * Bringing designs in, and truth tables out. The import itself is the pure
 * lib/import; here are the checks around it: the caller's role, the family,
 * the workspace, and one refusal shape (422 import_refused with the located
 * diagnostics in details) so that nothing is created from a refused text.
 */
import { AppError } from "../errors";
import { importDesign, TABLE_CSV_MAX_INPUTS, TableReader, truthTableCsv, type ImportKind, type ImportResult } from "../import";
import { compileSource } from "../lang";
import { requireAccess, requireActor, type Actor } from "./access";
import { createDesign, usableFamily, type DesignDetail } from "./designs";
import { getRevision } from "./revisions";
import { pinnedAnswers, resolverOf } from "./library-resolve";

export interface ImportRequest {
  kind: ImportKind;
  text: string;
  outputs?: string[];
  fileName?: string;
}

/** The import without saving anything (any signed-in caller; the route counts it like a compilation). */
export function previewImport(p: { actor: Actor | null } & ImportRequest): ImportResult {
  requireActor(p.actor);
  return importDesign(p.kind, p.text, { outputs: p.outputs, name: p.fileName });
}

/**
 * Creates a design whose draft is the imported source (designer or owner).
 * A refused text creates nothing: 422 import_refused, details.diagnostics.
 */
export async function createImportedDesign(
  p: { actor: Actor | null; slug: string; name: string; description?: string; familyId: string } & ImportRequest,
): Promise<{ design: DesignDetail; diagnostics: ImportResult["diagnostics"] }> {
  const { workspace } = await requireAccess(p.actor, p.slug, "design.edit");
  await usableFamily(workspace.id, p.familyId);
  const result = importDesign(p.kind, p.text, { outputs: p.outputs, name: p.fileName });
  if (result.source === null) {
    const errors = result.diagnostics.filter((d) => d.severity === "error");
    const what = p.kind === "csv" ? "truth table" : "Verilog module";
    throw new AppError(
      "import_refused",
      `The ${what} was not imported (${errors.length} problem${errors.length === 1 ? "" : "s"}): ${errors[0]?.message ?? "see the diagnostics"}.`,
      { diagnostics: result.diagnostics },
    );
  }
  const design = await createDesign({
    actor: p.actor,
    slug: p.slug,
    name: p.name,
    description: p.description,
    familyId: p.familyId,
    draftSource: result.source,
  });
  return { design, diagnostics: result.diagnostics };
}

/**
 * A revision's truth table from its saved source: the whole table as CSV (up
 * to TABLE_CSV_MAX_INPUTS inputs), or one page of rows as JSON (offset
 * default 0, limit default 256, at most 1024).
 */
export async function revisionTable(p: {
  actor: Actor | null;
  slug: string;
  designId: string;
  number: number;
  format: "csv" | "json";
  offset?: number;
  limit?: number;
}) {
  const rev = await getRevision(p);
  // The library blocks as the revision pinned them, whatever the libraries hold now.
  const compiled = compileSource(rev.source, { resolve: resolverOf(await pinnedAnswers(rev.id)) });
  if (!compiled.spec) {
    throw new AppError("compile_errors", "This revision no longer compiles with the current language; its table cannot be worked out.", { diagnostics: compiled.diagnostics });
  }
  const spec = compiled.spec;
  if (p.format === "csv") {
    if (spec.inputs.length > TABLE_CSV_MAX_INPUTS) {
      throw new AppError(
        "compile_limit",
        `Truth-table files stop at ${TABLE_CSV_MAX_INPUTS} inputs (${2 ** TABLE_CSV_MAX_INPUTS} rows) and this design has ${spec.inputs.length}; page through the rows with format=json instead.`,
        { limit: "TABLE_CSV_MAX_INPUTS", value: spec.inputs.length },
      );
    }
    return { kind: "csv" as const, body: truthTableCsv(spec), number: rev.number };
  }
  const reader = new TableReader(spec);
  const offset = p.offset ?? 0;
  const limit = Math.min(p.limit ?? 256, 1024);
  const rows = reader.rows(offset, limit).map((r) => ({ minterm: r.minterm, cells: [...r.inputs, ...r.outputs] }));
  return {
    kind: "json" as const,
    page: { inputs: spec.inputs, outputs: reader.outputs, rowCount: reader.rowCount, offset, limit, rows },
  };
}
