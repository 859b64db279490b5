import "server-only";
/**
 * Two revisions of a design side by side. Every figure comes from what was
 * stored with each revision (its stats, its netlist, its family snapshot and
 * settings); nothing is minimized or mapped again. The unsaved draft, which
 * has no stored figures, is compiled on the server's one compile path (the
 * same run, and kept result, as the workbench's) and set against a stored
 * revision.
 */
import { db } from "../db/connection";
import { AppError, invalid, notFound } from "../errors";
import { compileOnServer, type SavedNetlist } from "../runtime/compile";
import type { NetlistDocument } from "../export";
import type { Family } from "../families";
import { familyFanOut } from "../families/derive";
import { analyse } from "../analysis";
import { resolveSettings, type DesignSettings } from "../pipeline";
import { compareFigures, diffCounts, figuresOf, lineDiff, type Comparison, type DiffLine, type Figures } from "../review";
import { iso, requireAccess, type Actor } from "./access";
import { getDesign } from "./designs";
import { boundaryFamilies, familyOf } from "./families";

export interface RevisionSide {
  revision: {
    number: number;
    message: string;
    author: { id: string; name: string };
    createdAt: string;
  };
  figures: Figures;
  source: string;
  /** The netlist saved with the revision; null for rows saved before netlists were kept. */
  netlist: NetlistDocument | null;
  /** The estimated critical path of that netlist. */
  critical: { nets: string[]; gates: string[] };
}

export interface RevisionComparison {
  from: RevisionSide;
  to: RevisionSide;
  comparison: Comparison;
  source: { lines: DiffLine[]; added: number; removed: number };
}

type Rev = InstanceType<ReturnType<typeof db>["models"]["Revision"]>;

async function designIn(workspaceId: string, designId: string) {
  const d = await db().models.Design.findOne({ where: { id: designId, workspaceId } });
  if (!d) throw notFound("design");
  return d;
}

function fallbackFanOut(r: Rev): number | null {
  const s = r.settings as { fanOut?: unknown };
  if (typeof s.fanOut === "number") return s.fanOut;
  try {
    return familyFanOut(r.familySnapshot as unknown as Family);
  } catch {
    return null;
  }
}

/**
 * The critical path saved with the revision; for rows saved before it was
 * kept, the analysis of the stored netlist against the stored family
 * snapshot (the netlist itself is not rebuilt).
 */
function criticalOf(r: Rev, saved: SavedNetlist | null): RevisionSide["critical"] {
  if (saved?.critical) return saved.critical;
  if (!saved?.model) return { nets: [], gates: [] };
  // The options the pipeline's analysis stage gives (lib/pipeline runStages), from the stored settings.
  const s = resolveSettings(r.settings as DesignSettings);
  const fanOut = fallbackFanOut(r);
  const a = analyse(saved.model, r.familySnapshot as unknown as Family, {
    ...(fanOut !== null ? { fanOut } : {}),
    outputPinLoad: s.outputPinLoad,
    clockMHz: s.clockMHz,
    activity: s.activity,
  });
  return { nets: a.criticalPath.nets, gates: a.criticalPath.gates };
}

/** One stored revision as a side of a comparison. */
export function sideOf(r: Rev, author: { id: string; name: string }): RevisionSide {
  const saved = (r.netlist as unknown as SavedNetlist | null) ?? null;
  const family = r.familySnapshot as { id?: string; name?: string };
  const figures = figuresOf({
    stats: r.stats,
    netlist: saved?.document ?? null,
    family: { id: String(family.id ?? ""), name: String(family.name ?? family.id ?? "") },
    settings: r.settings,
    fanOutFallback: fallbackFanOut(r),
  });
  return {
    revision: { number: r.number, message: r.message, author, createdAt: iso(r.createdAt)! },
    figures,
    source: r.source,
    netlist: saved?.document ?? null,
    critical: criticalOf(r, saved),
  };
}

async function loadRevision(designId: string, number: number): Promise<RevisionSide> {
  const { Revision, User } = db().models;
  const r = await Revision.findOne({ where: { designId, number }, include: [{ model: User, as: "author", attributes: ["id", "name"] }] });
  if (!r) throw notFound(`revision r${number}`);
  const author = (r as unknown as { author: { id: string; name: string } }).author;
  return sideOf(r, { id: author.id, name: author.name });
}

/** One revision's figures, source, netlist and critical path, as stored. */
export async function getRevisionSide(p: { actor: Actor | null; slug: string; designId: string; number: number }): Promise<RevisionSide> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  await designIn(workspace.id, p.designId);
  return loadRevision(p.designId, p.number);
}

/**
 * Compares revision `from` with revision `to` of a design. Defaults: `to` the
 * latest revision, `from` the one before `to`. 400 when the design has a
 * single revision and no `from` is given, or when a number names no revision.
 */
export async function compareRevisions(p: { actor: Actor | null; slug: string; designId: string; from?: number; to?: number }): Promise<RevisionComparison> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  await designIn(workspace.id, p.designId);
  const latest = (await db().models.Revision.max("number", { where: { designId: p.designId } })) as number | null;
  if (!latest) throw invalid("This design has no revisions yet; save one, then save another to compare them.");
  const to = p.to ?? latest;
  const from = p.from ?? to - 1;
  if (from < 1) {
    throw invalid(`r${to} is the first revision, so there is none before it; give from= another revision's number.`, [{ path: "from", message: "no revision before r1" }]);
  }
  const [a, b] = await Promise.all([loadRevision(p.designId, from), loadRevision(p.designId, to)]);
  const lines = lineDiff(a.source, b.source);
  return { from: a, to: b, comparison: compareFigures(a.figures, b.figures), source: { lines, ...diffCounts(lines) } };
}

/** The design's draft as the `to` side of a comparison: figures from compiling it now. */
export interface DraftSide {
  draft: {
    /** The draft's version (bumped by every write of its source, family or settings). */
    version: number;
    updatedAt: string | null;
    updatedBy: { id: string; name: string } | null;
  };
  figures: Figures;
  source: string;
  netlist: NetlistDocument;
  critical: { nets: string[]; gates: string[] };
}

export interface DraftComparison {
  from: RevisionSide;
  to: DraftSide;
  comparison: Comparison;
  source: { lines: DiffLine[]; added: number; removed: number };
}

/**
 * Compares the design's draft (its source, family and settings as last
 * written, not yet saved as a revision) with revision `from` (default: the
 * latest). The revision's figures are the stored ones; the draft's come from
 * the pipeline through the server's compile path. 400 when the design has no
 * revision; 422 with the diagnostics when the draft has errors.
 */
export async function compareDraft(p: { actor: Actor | null; slug: string; designId: string; from?: number; signal?: AbortSignal }): Promise<DraftComparison> {
  const { workspace } = await requireAccess(p.actor, p.slug, "compile.run");
  const design = await getDesign({ actor: p.actor, slug: p.slug, designId: p.designId });
  const latest = (await db().models.Revision.max("number", { where: { designId: design.id } })) as number | null;
  if (!latest) throw invalid("This design has no revisions yet; save the draft as its first revision, then compare later drafts with it.");
  const a = await loadRevision(design.id, p.from ?? latest);
  const row = await db().models.LogicFamilyRecord.findByPk(design.family.id);
  if (!row) throw notFound("family");
  const family = familyOf(row);
  const out = await compileOnServer({
    source: design.draftSource, family, settings: design.settings, userId: p.actor!.userId, workspaceId: workspace.id,
    // the families at the design's edges, as the workbench's compile has them (so the kept result is the same)
    families: await boundaryFamilies(workspace.id, design.settings),
    ...(p.signal ? { signal: p.signal } : {}),
  });
  if (!out.result) {
    throw new AppError("compile_errors", "The draft has errors, so it has no figures to compare; fix them in the workbench.", { diagnostics: out.diagnostics });
  }
  const r = out.result;
  const figures = figuresOf({
    stats: r.stats as unknown as Record<string, unknown>,
    netlist: r.document,
    family: { id: family.id, name: family.name },
    settings: design.settings,
  });
  const lines = lineDiff(a.source, design.draftSource);
  return {
    from: a,
    to: {
      draft: { version: design.draftVersion, updatedAt: design.draftUpdatedAt, updatedBy: design.draftUpdatedBy },
      figures,
      source: design.draftSource,
      netlist: r.document,
      critical: { nets: r.analysis.criticalPath.nets, gates: r.analysis.criticalPath.gates },
    },
    comparison: compareFigures(a.figures, figures),
    source: { lines, ...diffCounts(lines) },
  };
}
