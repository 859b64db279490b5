import "server-only";
/**
 * Two revisions of a design side by side. Every figure comes from what was
 * stored with each revision (its stats, its netlist, its family snapshot and
 * settings); nothing is minimized or mapped again.
 */
import { db } from "../db/connection";
import { invalid, notFound } from "../api/errors";
import type { SavedNetlist } from "../api/compile";
import type { NetlistDocument } from "../export";
import type { Family } from "../families";
import { familyFanOut } from "../families/derive";
import { analyse } from "../analysis";
import { compareFigures, diffCounts, figuresOf, lineDiff, type Comparison, type DiffLine, type Figures } from "../review";
import { iso, requireAccess, type Actor } from "./access";

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
  const s = r.settings as { fanOut?: number; outputPinLoad?: number; clockMHz?: number; activity?: number };
  const a = analyse(saved.model, r.familySnapshot as unknown as Family, {
    ...(s.fanOut !== undefined ? { fanOut: s.fanOut } : {}),
    ...(s.outputPinLoad !== undefined ? { outputPinLoad: s.outputPinLoad } : {}),
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
