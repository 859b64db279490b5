import "server-only";
/**
 * Reviews of revisions. A designer (or owner) asks one or more members who may
 * approve to review a revision; each gets an e-mail with a link to the
 * comparison. Members comment (generally or on a line of the revision's
 * source); those asked approve or ask for changes with a note. States, all of
 * our own naming:
 *
 * - open — asked, not yet decided;
 * - approved — every member asked has approved;
 * - changes-asked — one of them asked for changes (the designer answers, saves
 *   a new revision and asks again);
 * - withdrawn — the member who asked (or an owner) took it back;
 * - superseded — a later revision of the same design was put up for review.
 *
 * Decisions are history: the database refuses to change or delete them, and a
 * review's state leaves "open" only together with the decision that says so.
 * The author of a revision never approves it. Every function re-checks the
 * caller's membership and role; another workspace's reviews answer 404.
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import { db } from "../db/connection";
import { AppError, conflict, invalid, notFound } from "../errors";
import { can } from "../auth/permissions";
import { sendMail, siteUrl } from "../auth/mail";
import type { ReviewState, ReviewVerdict } from "../../models";
import { iso, requireAccess, type Access, type Actor } from "./access";

export type { ReviewState, ReviewVerdict };

export interface Person {
  id: string;
  name: string;
}

export interface ReviewerView extends Person {
  /** This member's decision on the review, if any. */
  verdict: "approved" | "changes-asked" | null;
  decidedAt: string | null;
}

export interface ReviewSummary {
  id: string;
  design: { id: string; name: string };
  revision: { number: number; message: string; author: Person };
  state: ReviewState;
  message: string;
  requestedBy: Person;
  reviewers: ReviewerView[];
  commentCount: number;
  createdAt: string;
  updatedAt: string;
}

export interface CommentView {
  id: string;
  author: Person;
  body: string;
  /** The line of the reviewed revision's source, 1-based; null for a general comment. */
  line: number | null;
  createdAt: string;
}

export interface DecisionView {
  id: string;
  reviewId: string;
  design: { id: string; name: string };
  /** The number of the revision decided on. */
  revision: number;
  verdict: ReviewVerdict;
  note: string;
  user: Person;
  createdAt: string;
}

export interface ReviewDetail extends ReviewSummary {
  comments: CommentView[];
  decisions: DecisionView[];
  /** The revision the review compares against by default: the one before, or null for a first revision. */
  compareFrom: number | null;
}

export interface ReviewInbox {
  /** Open reviews the caller was asked for and has not decided yet, oldest first. */
  waitingForMe: ReviewSummary[];
  /** Reviews the caller asked for, most recently changed first (at most 30). */
  askedByMe: ReviewSummary[];
  /** The workspace's latest decisions (at most 20), newest first. */
  recentDecisions: DecisionView[];
}

/** Longest review message, comment or decision note, in characters. */
export const REVIEW_TEXT_MAX = 4000;

type Models = ReturnType<typeof db>["models"];
type ReviewRow = InstanceType<Models["Review"]>;

// ---- loading -------------------------------------------------------------------

interface SummaryRow {
  id: string;
  state: ReviewState;
  message: string;
  created_at: Date;
  updated_at: Date;
  design_id: string;
  design_name: string;
  number: number;
  rev_message: string;
  author_id: string;
  author_name: string;
  requester_id: string;
  requester_name: string;
  comment_count: string;
}

const SUMMARY_SQL = `
  SELECT r.id, r.state, r.message, r.created_at, r.updated_at,
         d.id AS design_id, d.name AS design_name,
         v.number, v.message AS rev_message, au.id AS author_id, au.name AS author_name,
         rq.id AS requester_id, rq.name AS requester_name,
         (SELECT count(*) FROM review_comments c WHERE c.review_id = r.id) AS comment_count
  FROM reviews r
  JOIN designs d ON d.id = r.design_id
  JOIN revisions v ON v.id = r.revision_id
  JOIN users au ON au.id = v.author_id
  JOIN users rq ON rq.id = r.requested_by`;

/** Summaries of the given reviews of one workspace, in the order of `ids`. */
async function summaries(workspaceId: string, ids: string[]): Promise<ReviewSummary[]> {
  if (!ids.length) return [];
  const { sequelize } = db();
  const rows = await sequelize.query<SummaryRow>(`${SUMMARY_SQL} WHERE d.workspace_id = :ws AND r.id IN (:ids)`, {
    replacements: { ws: workspaceId, ids },
    type: QueryTypes.SELECT,
  });
  const people = await sequelize.query<{ review_id: string; user_id: string; name: string; verdict: "approved" | "changes-asked" | null; decided_at: Date | null }>(
    `SELECT rr.review_id, u.id AS user_id, u.name,
            (SELECT x.verdict::text FROM review_decisions x WHERE x.review_id = rr.review_id AND x.user_id = u.id
               AND x.verdict IN ('approved', 'changes-asked') ORDER BY x.created_at DESC LIMIT 1) AS verdict,
            (SELECT x.created_at FROM review_decisions x WHERE x.review_id = rr.review_id AND x.user_id = u.id
               AND x.verdict IN ('approved', 'changes-asked') ORDER BY x.created_at DESC LIMIT 1) AS decided_at
     FROM review_reviewers rr JOIN users u ON u.id = rr.user_id
     WHERE rr.review_id IN (:ids) ORDER BY u.name`,
    { replacements: { ids }, type: QueryTypes.SELECT },
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.flatMap((id) => {
    const r = byId.get(id);
    if (!r) return [];
    return [{
      id: r.id,
      design: { id: r.design_id, name: r.design_name },
      revision: { number: r.number, message: r.rev_message, author: { id: r.author_id, name: r.author_name } },
      state: r.state,
      message: r.message,
      requestedBy: { id: r.requester_id, name: r.requester_name },
      reviewers: people
        .filter((p) => p.review_id === id)
        .map((p) => ({ id: p.user_id, name: p.name, verdict: p.verdict, decidedAt: iso(p.decided_at) })),
      commentCount: Number(r.comment_count),
      createdAt: iso(r.created_at)!,
      updatedAt: iso(r.updated_at)!,
    }];
  });
}

interface DecisionRow {
  id: string;
  review_id: string;
  design_id: string;
  design_name: string;
  number: number;
  verdict: ReviewVerdict;
  note: string;
  user_id: string;
  user_name: string;
  created_at: Date;
}

const DECISION_SQL = `
  SELECT x.id, x.review_id, d.id AS design_id, d.name AS design_name, v.number, x.verdict, x.note,
         u.id AS user_id, u.name AS user_name, x.created_at
  FROM review_decisions x
  JOIN reviews r ON r.id = x.review_id
  JOIN designs d ON d.id = r.design_id
  JOIN revisions v ON v.id = x.revision_id
  JOIN users u ON u.id = x.user_id`;

const decisionView = (x: DecisionRow): DecisionView => ({
  id: x.id,
  reviewId: x.review_id,
  design: { id: x.design_id, name: x.design_name },
  revision: x.number,
  verdict: x.verdict,
  note: x.note,
  user: { id: x.user_id, name: x.user_name },
  createdAt: iso(x.created_at)!,
});

/** A review of the workspace, or 404. */
async function reviewIn(workspaceId: string, reviewId: string, transaction?: Transaction): Promise<ReviewRow> {
  const { Review, Design } = db().models;
  const r = await Review.findOne({
    where: { id: reviewId },
    include: [{ model: Design, as: "design", attributes: ["id"], where: { workspaceId }, required: true }],
    ...(transaction ? { transaction, lock: { level: transaction.LOCK.UPDATE, of: Review } } : {}),
  });
  if (!r) throw notFound("review");
  return r;
}

async function detail(workspaceId: string, reviewId: string): Promise<ReviewDetail> {
  const [summary] = await summaries(workspaceId, [reviewId]);
  if (!summary) throw notFound("review");
  const { sequelize } = db();
  const comments = await sequelize.query<{ id: string; body: string; line: number | null; created_at: Date; author_id: string; author_name: string }>(
    `SELECT c.id, c.body, c.line, c.created_at, u.id AS author_id, u.name AS author_name
     FROM review_comments c JOIN users u ON u.id = c.author_id WHERE c.review_id = :id ORDER BY c.created_at, c.id`,
    { replacements: { id: reviewId }, type: QueryTypes.SELECT },
  );
  const decisions = await sequelize.query<DecisionRow>(`${DECISION_SQL} WHERE x.review_id = :id ORDER BY x.created_at, x.id`, {
    replacements: { id: reviewId },
    type: QueryTypes.SELECT,
  });
  const previous = (await db().models.Revision.max("number", {
    where: { designId: summary.design.id, number: { [Op.lt]: summary.revision.number } },
  })) as number | null;
  return {
    ...summary,
    comments: comments.map((c) => ({ id: c.id, author: { id: c.author_id, name: c.author_name }, body: c.body, line: c.line, createdAt: iso(c.created_at)! })),
    decisions: decisions.map(decisionView),
    compareFrom: previous ?? null,
  };
}

function reviewLink(slug: string, designId: string, reviewId: string): string {
  return siteUrl(`/w/${encodeURIComponent(slug)}/d/${designId}/compare?review=${reviewId}`);
}

/** Sends each mail; a failed send is logged and reported, never undoes what was recorded. */
async function mailAll(messages: Array<Parameters<typeof sendMail>[0]>): Promise<string[]> {
  const failed: string[] = [];
  for (const m of messages) {
    try {
      await sendMail(m);
    } catch (e) {
      console.error(`review mail to ${m.to} failed:`, e);
      failed.push(m.to);
    }
  }
  return failed;
}

const clean = (s: string | undefined) => (s ?? "").trim();

function textLimit(s: string, field: string) {
  if (s.length > REVIEW_TEXT_MAX) throw invalid(`The ${field} is ${s.length} characters long; keep it under ${REVIEW_TEXT_MAX}.`, [{ path: field, message: "too long" }]);
}

// ---- reading -------------------------------------------------------------------

/** A design's reviews, newest first (any member). */
export async function listDesignReviews(p: { actor: Actor | null; slug: string; designId: string }): Promise<ReviewSummary[]> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  const d = await db().models.Design.findOne({ where: { id: p.designId, workspaceId: workspace.id } });
  if (!d) throw notFound("design");
  const rows = await db().sequelize.query<{ id: string }>(
    "SELECT id FROM reviews WHERE design_id = :d ORDER BY created_at DESC, id LIMIT 500",
    { replacements: { d: d.id }, type: QueryTypes.SELECT },
  );
  return summaries(workspace.id, rows.map((r) => r.id));
}

/** One review with its thread and its decisions (any member). */
export async function getReview(p: { actor: Actor | null; slug: string; reviewId: string }): Promise<ReviewDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  await reviewIn(workspace.id, p.reviewId);
  return detail(workspace.id, p.reviewId);
}

/** What waits for the caller, what they asked for, and the workspace's recent decisions. */
export async function reviewInbox(p: { actor: Actor | null; slug: string }): Promise<ReviewInbox> {
  const { workspace } = await requireAccess(p.actor, p.slug, "revision.read");
  const me = p.actor!.userId;
  const { sequelize } = db();
  const q = (sql: string) => sequelize.query<{ id: string }>(sql, { replacements: { ws: workspace.id, me }, type: QueryTypes.SELECT });
  const waiting = await q(`
    SELECT r.id FROM reviews r
    JOIN designs d ON d.id = r.design_id
    JOIN review_reviewers rr ON rr.review_id = r.id AND rr.user_id = :me
    WHERE d.workspace_id = :ws AND r.state = 'open'
      AND NOT EXISTS (SELECT 1 FROM review_decisions x WHERE x.review_id = r.id AND x.user_id = :me)
    ORDER BY r.created_at, r.id`);
  const asked = await q(`
    SELECT r.id FROM reviews r JOIN designs d ON d.id = r.design_id
    WHERE d.workspace_id = :ws AND r.requested_by = :me
    ORDER BY r.updated_at DESC, r.id LIMIT 30`);
  const decisions = await sequelize.query<DecisionRow>(`${DECISION_SQL} WHERE d.workspace_id = :ws ORDER BY x.created_at DESC, x.id LIMIT 20`, {
    replacements: { ws: workspace.id },
    type: QueryTypes.SELECT,
  });
  return {
    waitingForMe: await summaries(workspace.id, waiting.map((r) => r.id)),
    askedByMe: await summaries(workspace.id, asked.map((r) => r.id)),
    recentDecisions: decisions.map(decisionView),
  };
}

// ---- asking --------------------------------------------------------------------

/**
 * Asks members to review revision `number` (designer, owner). Each member
 * asked must be one whose role may approve, and not the revision's author nor
 * the caller. Open reviews of earlier revisions of the design become
 * superseded. 409 when this revision has an open review already. Each member
 * asked gets an e-mail linking to the comparison; `mailFailed` lists the
 * addresses that could not be reached (the review stands).
 */
export async function requestReview(p: {
  actor: Actor | null;
  slug: string;
  designId: string;
  number: number;
  reviewers: string[];
  message?: string;
}): Promise<{ review: ReviewDetail; mailFailed: string[] }> {
  const access = await requireAccess(p.actor, p.slug, "review.request");
  const { workspace } = access;
  const me = p.actor!.userId;
  const { sequelize, models } = db();
  const design = await models.Design.findOne({ where: { id: p.designId, workspaceId: workspace.id } });
  if (!design) throw notFound("design");
  const revision = await models.Revision.findOne({ where: { designId: design.id, number: p.number } });
  if (!revision) throw notFound(`revision r${p.number}`);
  const message = clean(p.message);
  textLimit(message, "message");
  const ids = [...new Set(p.reviewers)];
  if (!ids.length) throw invalid("Name at least one member to review the revision.", [{ path: "reviewers", message: "empty" }]);
  const members = await models.Membership.findAll({
    where: { workspaceId: workspace.id, userId: { [Op.in]: ids } },
    include: [{ model: models.User, as: "user", attributes: ["id", "name", "email"] }],
  });
  const problems: Array<{ path: string; message: string }> = [];
  for (const [i, id] of ids.entries()) {
    const m = members.find((x) => x.userId === id);
    if (!m) problems.push({ path: `reviewers.${i}`, message: "not a member of this workspace" });
    else if (!can(m.role, "review.approve")) problems.push({ path: `reviewers.${i}`, message: `a ${m.role} cannot approve revisions; ask a reviewer or an owner` });
    else if (id === revision.authorId) problems.push({ path: `reviewers.${i}`, message: "the author of a revision cannot review it" });
    else if (id === me) problems.push({ path: `reviewers.${i}`, message: "ask someone other than yourself" });
  }
  if (problems.length) {
    throw invalid(`Some of the members named cannot review r${revision.number}: ${problems.map((x) => x.message).join("; ")}.`, problems);
  }
  const reviewId = await sequelize.transaction(async (transaction) => {
    // One design at a time: two requests cannot both supersede, or both open, the same reviews.
    await models.Design.findByPk(design.id, { lock: transaction.LOCK.UPDATE, transaction });
    const open = await models.Review.findOne({ where: { revisionId: revision.id, state: "open" }, transaction });
    if (open) {
      throw conflict(`r${revision.number} has an open review already; wait for its decision, or withdraw it and ask again.`, { reviewId: open.id });
    }
    const review = await models.Review.create({ designId: design.id, revisionId: revision.id, requestedBy: me, message }, { transaction });
    for (const id of ids) await models.ReviewReviewer.create({ reviewId: review.id, userId: id }, { transaction });
    const older = await sequelize.query<{ id: string; revision_id: string }>(
      `SELECT r.id, r.revision_id FROM reviews r JOIN revisions v ON v.id = r.revision_id
       WHERE r.design_id = :d AND r.state = 'open' AND v.number < :n FOR UPDATE OF r`,
      { replacements: { d: design.id, n: revision.number }, type: QueryTypes.SELECT, transaction },
    );
    for (const o of older) {
      await models.ReviewDecision.create(
        { reviewId: o.id, revisionId: o.revision_id, userId: me, verdict: "superseded", note: `r${revision.number} was put up for review` },
        { transaction },
      );
      await models.Review.update({ state: "superseded" }, { where: { id: o.id }, transaction });
    }
    return review.id;
  });
  const requester = (await models.User.findByPk(me))!;
  const url = reviewLink(workspace.slug, design.id, reviewId);
  const mailFailed = await mailAll(
    members.map((m) => {
      const u = (m as unknown as { user: { name: string; email: string } }).user;
      return {
        to: u.email,
        subject: `${requester.name} asks you to review r${revision.number} of ${design.name}`,
        lines: [
          `${requester.name} asks you to review revision r${revision.number} of "${design.name}" in ${workspace.name}.`,
          ...(message ? [`Their note: ${message}`] : []),
          `What changed in r${revision.number}: ${revision.message}`,
          "The link opens this revision beside the one before it: the figures, the equations line by line, the netlist and both schematics. Comment on any line there, then approve or ask for changes.",
        ],
        link: { url, label: "Open the review" },
      };
    }),
  );
  return { review: await detail(workspace.id, reviewId), mailFailed };
}

// ---- the thread ----------------------------------------------------------------

/**
 * Adds a comment (reviewer, designer, owner; a viewer reads only). `line`
 * ties it to a line of the reviewed revision's source and must name one.
 */
export async function addComment(p: { actor: Actor | null; slug: string; reviewId: string; body: string; line?: number | null }): Promise<ReviewDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "review.comment");
  const { models } = db();
  const review = await reviewIn(workspace.id, p.reviewId);
  const body = clean(p.body);
  if (!body) throw invalid("Write something in the comment.", [{ path: "body", message: "empty" }]);
  textLimit(body, "body");
  const line = p.line ?? null;
  if (line !== null) {
    const rev = (await models.Revision.findByPk(review.revisionId, { attributes: ["number", "source"] }))!;
    const count = rev.source.replace(/\r\n?/g, "\n").replace(/\n$/, "").split("\n").length;
    if (line > count) {
      throw invalid(`r${rev.number} has ${count} lines; comment on a line from 1 to ${count}, or leave the line out for a general comment.`, [{ path: "line", message: "no such line" }]);
    }
  }
  await models.ReviewComment.create({ reviewId: review.id, authorId: p.actor!.userId, body, line });
  return detail(workspace.id, review.id);
}

// ---- decisions -----------------------------------------------------------------

/**
 * Records a reviewer's decision (reviewer, owner): "approved" or
 * "changes-asked" (a note is required then). Only members asked may decide,
 * each once, never on their own revision, and only while the review is open.
 * The review becomes changes-asked at once, or approved when every member
 * asked has approved. The member who asked gets an e-mail.
 */
export async function decideReview(p: {
  actor: Actor | null;
  slug: string;
  reviewId: string;
  verdict: "approved" | "changes-asked";
  note?: string;
}): Promise<ReviewDetail> {
  const { workspace } = await requireAccess(p.actor, p.slug, "review.approve");
  const me = p.actor!.userId;
  const note = clean(p.note);
  textLimit(note, "note");
  if (p.verdict === "changes-asked" && !note) {
    throw invalid("Say which changes you ask for in the note.", [{ path: "note", message: "required when asking for changes" }]);
  }
  const { sequelize, models } = db();
  const outcome = await sequelize.transaction(async (transaction) => {
    const review = await reviewIn(workspace.id, p.reviewId, transaction);
    const revision = (await models.Revision.findByPk(review.revisionId, { transaction }))!;
    if (revision.authorId === me) {
      throw new AppError("forbidden", `You wrote r${revision.number}; a revision is approved or sent back by someone other than its author.`);
    }
    const asked = await models.ReviewReviewer.findAll({ where: { reviewId: review.id }, transaction });
    if (!asked.some((a) => a.userId === me)) {
      throw new AppError("forbidden", "You were not asked to review this revision; comment instead, or ask the designer to add you.");
    }
    if (review.state !== "open") throw conflict(`This review is ${review.state.replace("-", " ")} already; decisions are taken while it is open.`);
    const mine = await models.ReviewDecision.findOne({ where: { reviewId: review.id, userId: me }, transaction });
    if (mine) throw conflict("You have decided on this review already; decisions are history and are not changed. Comment to add to yours.");
    await models.ReviewDecision.create({ reviewId: review.id, revisionId: revision.id, userId: me, verdict: p.verdict, note }, { transaction });
    let state: ReviewState = "open";
    if (p.verdict === "changes-asked") state = "changes-asked";
    else {
      const approvals = await models.ReviewDecision.findAll({ where: { reviewId: review.id, verdict: "approved" }, attributes: ["userId"], transaction });
      const approvedBy = new Set(approvals.map((a) => a.userId));
      if (asked.every((a) => approvedBy.has(a.userId))) state = "approved";
    }
    if (state !== "open") await review.update({ state }, { transaction });
    return { state, revision, requestedBy: review.requestedBy, designId: review.designId };
  });
  const [me_, requester, design] = await Promise.all([
    models.User.findByPk(me),
    models.User.findByPk(outcome.requestedBy),
    models.Design.findByPk(outcome.designId),
  ]);
  if (requester && requester.id !== me) {
    const what = p.verdict === "approved" ? "approved" : "asked for changes on";
    await mailAll([{
      to: requester.email,
      subject: `${me_!.name} ${what} r${outcome.revision.number} of ${design!.name}`,
      lines: [
        `${me_!.name} ${what} revision r${outcome.revision.number} of "${design!.name}".`,
        ...(note ? [`Their note: ${note}`] : []),
        outcome.state === "approved"
          ? "Everyone you asked has approved it: the review is approved."
          : outcome.state === "changes-asked"
            ? "Answer in the review's thread, save a new revision with the changes, and ask again."
            : "The review stays open until everyone you asked has decided.",
      ],
      link: { url: reviewLink(workspace.slug, outcome.designId, p.reviewId), label: "Open the review" },
    }]);
  }
  return detail(workspace.id, p.reviewId);
}

/** Withdraws an open review (the member who asked, or an owner), with an optional note. */
export async function withdrawReview(p: { actor: Actor | null; slug: string; reviewId: string; note?: string }): Promise<ReviewDetail> {
  const access: Access = await requireAccess(p.actor, p.slug, "review.request");
  const me = p.actor!.userId;
  const note = clean(p.note);
  textLimit(note, "note");
  const { sequelize, models } = db();
  await sequelize.transaction(async (transaction) => {
    const review = await reviewIn(access.workspace.id, p.reviewId, transaction);
    if (review.requestedBy !== me && !can(access.role, "review.manage")) {
      throw new AppError("forbidden", "Only the member who asked for this review, or an owner, may withdraw it.");
    }
    if (review.state !== "open") throw conflict(`This review is ${review.state.replace("-", " ")} already; only an open review can be withdrawn.`);
    await models.ReviewDecision.create({ reviewId: review.id, revisionId: review.revisionId, userId: me, verdict: "withdrawn", note }, { transaction });
    await review.update({ state: "withdrawn" }, { transaction });
  });
  return detail(access.workspace.id, p.reviewId);
}
