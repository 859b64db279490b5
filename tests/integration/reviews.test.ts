/**
 * Reviews on the real database through the route handlers: asking (with the
 * e-mail caught by the local mail catcher), line comments, decisions and the
 * states open → approved / changes-asked / withdrawn / superseded, the rules
 * on who decides, the immutability of decisions in the database itself, and
 * the comparison's figures read back from what each revision stored.
 */
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { QueryTypes, Sequelize } from "sequelize";
import pg from "pg";
import { db } from "@/lib/db/connection";
import { createRevision } from "@/lib/data/revisions";
import * as compareRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/compare/route";
import * as draftCompareRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/compare/route";
import * as figuresRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/figures/route";
import * as designReviews from "@/app/api/v1/workspaces/[ws]/designs/[designId]/reviews/route";
import * as inbox from "@/app/api/v1/workspaces/[ws]/reviews/route";
import * as reviewRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/route";
import * as commentsRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/comments/route";
import * as decisionsRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/decisions/route";
import * as withdrawRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/withdraw/route";
import { addMember, builtinFamily, call, linkIn, mailTo, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

const V1 = `// Ferrow Lock & Weir: upper gate permit
inputs lower_shut, level_upper, override_key, estop
outputs open_upper
open_upper = estop' * lower_shut * (level_upper + override_key)
`;
// The key no longer bypasses the level check: one term fewer.
const V2 = `// Ferrow Lock & Weir: upper gate permit
inputs lower_shut, level_upper, override_key, estop
outputs open_upper
open_upper = estop' * lower_shut * level_upper
`;

let owner: TestUser, designer: TestUser, reviewer: TestUser, reviewer2: TestUser, viewer: TestUser;
let ws: { id: string; slug: string };
let familyId: string;
let designId: string;

const as = (u: TestUser) => ({ userId: u.id, via: "token" as const });

async function save(u: TestUser, source: string, message: string) {
  return (await createRevision({ actor: as(u), slug: ws.slug, designId, message, source, familyId, settings: {} })).number;
}

async function ask(u: TestUser, revision: number, reviewers: TestUser[], message = "") {
  return call(designReviews.POST, "POST", "/rv", { token: u.token, params: { ws: ws.slug, designId }, body: { revision, reviewers: reviewers.map((r) => r.id), message } });
}

const decide = (u: TestUser, reviewId: string, verdict: string, note?: string) =>
  call(decisionsRoute.POST, "POST", "/d", { token: u.token, params: { ws: ws.slug, reviewId }, body: { verdict, ...(note !== undefined ? { note } : {}) } });
const comment = (u: TestUser, reviewId: string, body: string, line?: number) =>
  call(commentsRoute.POST, "POST", "/c", { token: u.token, params: { ws: ws.slug, reviewId }, body: { body, ...(line ? { line } : {}) } });
const getReview = (u: TestUser, reviewId: string) => call(reviewRoute.GET, "GET", "/r", { token: u.token, params: { ws: ws.slug, reviewId } });

beforeAll(async () => {
  owner = await makeUser("owner");
  ws = await makeWorkspace("reviews", owner);
  designer = await makeUser("designer");
  reviewer = await makeUser("reviewer");
  reviewer2 = await makeUser("reviewer2");
  viewer = await makeUser("viewer");
  await addMember(ws.id, designer, "designer");
  await addMember(ws.id, reviewer, "reviewer");
  await addMember(ws.id, reviewer2, "reviewer");
  await addMember(ws.id, viewer, "viewer");
  familyId = (await builtinFamily("ttl-std-5v")).id;
  const d = await db().models.Design.create({
    workspaceId: ws.id, name: `Upper gate ${tag()}`, description: "", familyId, settings: {}, draftSource: V1, createdBy: designer.id, archivedAt: null,
  });
  designId = d.id;
});

beforeEach(async () => {
  await resetLimits();
});

describe("a review from asking to approval", () => {
  it("asks, mails, takes line comments, sends back, is asked again and approved", async () => {
    const r1 = await save(designer, V1, "First cut of the upper gate permit");
    const asked = await ask(designer, r1, [reviewer, reviewer2], "Is the key handled right?");
    expect(asked.status).toBe(201);
    const review = asked.json.review;
    expect(review).toMatchObject({ state: "open", revision: { number: r1 }, requestedBy: { id: designer.id }, message: "Is the key handled right?" });
    expect(review.reviewers.map((r: { id: string }) => r.id).sort()).toEqual([reviewer.id, reviewer2.id].sort());
    expect(asked.json.mailFailed).toEqual([]);

    // Each member asked gets an e-mail linking to the comparison with this review open.
    for (const u of [reviewer, reviewer2]) {
      const mail = await mailTo(u.email);
      expect(mail.subject).toContain(`r${r1}`);
      const link = linkIn(mail.text);
      expect(link.pathname).toBe(`/w/${ws.slug}/d/${designId}/compare`);
      expect(link.searchParams.get("review")).toBe(review.id);
    }

    // Line 4 is the permit's equation; a line past the end is refused with the count.
    expect((await comment(reviewer, review.id, "Why does the key bypass the level-equal check?", 4)).status).toBe(201);
    const past = await comment(reviewer, review.id, "nowhere", 40);
    expect(past.status).toBe(400);
    expect(past.json.error.message).toMatch(/has 4 lines/);
    expect((await comment(designer, review.id, "The keeper needs it when the level sensor fails.", 4)).status).toBe(201);

    // The first approval leaves it open until everyone asked has decided; deciding twice is refused.
    const a = await decide(reviewer, review.id, "approved", "Fine by me");
    expect(a.status).toBe(201);
    expect(a.json.review.state).toBe("open");
    expect((await decide(reviewer, review.id, "approved")).status).toBe(409);

    // Asking for changes needs a note; with one, the review is sent back.
    expect((await decide(reviewer2, review.id, "changes-asked")).status).toBe(400);
    const back = await decide(reviewer2, review.id, "changes-asked", "Gate the key with the level of the far pound, or log each use.");
    expect(back.status).toBe(201);
    expect(back.json.review.state).toBe("changes-asked");
    expect((await mailTo(designer.email)).subject).toMatch(/asked for changes on r\d+/);

    // The thread and the history read back in order.
    const read = await getReview(viewer, review.id);
    expect(read.status).toBe(200);
    expect(read.json.review.comments.map((c: { line: number | null; author: { id: string } }) => [c.line, c.author.id])).toEqual([[4, reviewer.id], [4, designer.id]]);
    expect(read.json.review.decisions.map((d: { verdict: string; user: { id: string }; revision: number }) => [d.verdict, d.user.id, d.revision])).toEqual([
      ["approved", reviewer.id, r1],
      ["changes-asked", reviewer2.id, r1],
    ]);
    expect(read.json.review.reviewers.find((r: { id: string }) => r.id === reviewer2.id).verdict).toBe("changes-asked");
    // A closed review takes no more decisions.
    expect((await decide(reviewer2, review.id, "approved")).status).toBe(409);

    // The designer saves the change and asks again; one approval closes it.
    const r2 = await save(designer, V2, "The key no longer bypasses the level check");
    const again = await ask(designer, r2, [reviewer]);
    expect(again.status).toBe(201);
    // The earlier review had been decided, so it stays as decided (not superseded).
    expect((await getReview(designer, review.id)).json.review.state).toBe("changes-asked");
    const ok = await decide(reviewer, again.json.review.id, "approved", "Level check holds for the key too.");
    expect(ok.json.review.state).toBe("approved");
    expect(ok.json.review.compareFrom).toBe(r1);

    const list = await call(designReviews.GET, "GET", "/rv", { token: viewer.token, params: { ws: ws.slug, designId } });
    expect(list.json.items.slice(0, 2).map((r: { state: string; revision: { number: number } }) => [r.state, r.revision.number])).toEqual([["approved", r2], ["changes-asked", r1]]);
  });
});

describe("who may do what", () => {
  it("a viewer reads reviews and cannot comment; a designer cannot approve; only those asked decide", async () => {
    const n = await save(designer, V2.replace("upper gate", `upper gate ${tag()}`), "viewer case");
    const r = (await ask(designer, n, [reviewer])).json.review;
    expect((await getReview(viewer, r.id)).status).toBe(200);
    const c = await comment(viewer, r.id, "I see it");
    expect(c.status).toBe(403);
    expect(c.json.error.code).toBe("forbidden");
    expect((await decide(designer, r.id, "approved")).status).toBe(403);
    // The owner may approve, but was not asked for this one.
    const notAsked = await decide(owner, r.id, "approved");
    expect(notAsked.status).toBe(403);
    expect(notAsked.json.error.message).toMatch(/not asked/);
    // A reviewer cannot ask for reviews.
    expect((await ask(reviewer, n, [reviewer2])).status).toBe(403);
    expect((await getReview(viewer, r.id)).json.review.state).toBe("open");
  });

  it("nobody approves their own revision: the author cannot be asked, and a decision by the author is refused", async () => {
    const n = await save(owner, V1.replace("upper gate", `upper gate ${tag()}`), "owner writes a revision");
    const self = await ask(designer, n, [owner]);
    expect(self.status).toBe(400);
    expect(self.json.error.message).toMatch(/author of a revision cannot review it/);
    // Viewers and designers cannot be asked either; neither can the member asking.
    expect((await ask(designer, n, [viewer])).status).toBe(400);
    expect((await ask(owner, n, [owner])).status).toBe(400);
    // Even if the author stands among those asked (say, rows written another way), the decision is refused.
    const review = await db().models.Review.create({ designId, revisionId: (await db().models.Revision.findOne({ where: { designId, number: n } }))!.id, requestedBy: designer.id });
    await db().models.ReviewReviewer.create({ reviewId: review.id, userId: owner.id });
    const own = await decide(owner, review.id, "approved");
    expect(own.status).toBe(403);
    expect(own.json.error.message).toMatch(/You wrote r\d+/);
    expect((await getReview(owner, review.id)).json.review.state).toBe("open");
  });

  it("another workspace's member finds no review (404)", async () => {
    const n = await save(designer, V2.replace("upper gate", `upper gate ${tag()}`), "other case");
    const r = (await ask(designer, n, [reviewer])).json.review;
    const stranger = await makeUser("stranger");
    const theirs = await makeWorkspace("theirs", stranger);
    for (const slug of [ws.slug, theirs.slug]) {
      expect((await call(reviewRoute.GET, "GET", "/r", { token: stranger.token, params: { ws: slug, reviewId: r.id } })).status).toBe(404);
    }
  });
});

describe("superseded and withdrawn", () => {
  it("asking for a later revision supersedes the open review of an earlier one, with a decision on record", async () => {
    const a = await save(designer, V1.replace("upper gate", `upper gate ${tag()}`), "a");
    const first = (await ask(designer, a, [reviewer])).json.review;
    // The same revision cannot have two open reviews.
    const twice = await ask(designer, a, [reviewer2]);
    expect(twice.status).toBe(409);
    const b = await save(designer, V2.replace("upper gate", `upper gate ${tag()}`), "b");
    const second = await ask(designer, b, [reviewer]);
    expect(second.status).toBe(201);
    const old = (await getReview(reviewer, first.id)).json.review;
    expect(old.state).toBe("superseded");
    expect(old.decisions).toEqual([
      expect.objectContaining({ verdict: "superseded", user: expect.objectContaining({ id: designer.id }), revision: a, note: `r${b} was put up for review` }),
    ]);
    // A superseded review no longer waits for anyone.
    const box = await call(inbox.GET, "GET", "/i", { token: reviewer.token, params: { ws: ws.slug } });
    const waiting = box.json.waitingForMe.map((r: { id: string }) => r.id);
    expect(waiting).not.toContain(first.id);
    expect(waiting).toContain(second.json.review.id);
    expect((await decide(reviewer, first.id, "approved")).status).toBe(409);
  });

  it("the member who asked, or an owner, withdraws an open review; a reviewer cannot", async () => {
    const n = await save(designer, V1.replace("upper gate", `upper gate ${tag()}`), "to withdraw");
    const r = (await ask(designer, n, [reviewer])).json.review;
    const withdraw = (u: TestUser, id: string) => call(withdrawRoute.POST, "POST", "/w", { token: u.token, params: { ws: ws.slug, reviewId: id }, body: { note: "Saving a fix first" } });
    expect((await withdraw(reviewer, r.id)).status).toBe(403);
    const w = await withdraw(designer, r.id);
    expect(w.status).toBe(200);
    expect(w.json.review.state).toBe("withdrawn");
    expect(w.json.review.decisions.at(-1)).toMatchObject({ verdict: "withdrawn", note: "Saving a fix first", user: { id: designer.id } });
    expect((await withdraw(designer, r.id)).status).toBe(409);
    expect((await decide(reviewer, r.id, "approved")).status).toBe(409);
    // Withdrawn, it can be asked for afresh.
    expect((await ask(designer, n, [reviewer])).status).toBe(201);
  });

  it("the inbox lists what waits for me, what I asked and the recent decisions", async () => {
    const n = await save(designer, V2.replace("upper gate", `upper gate ${tag()}`), "inbox case");
    const r = (await ask(designer, n, [reviewer2])).json.review;
    const mine = await call(inbox.GET, "GET", "/i", { token: reviewer2.token, params: { ws: ws.slug } });
    expect(mine.json.waitingForMe.map((x: { id: string }) => x.id)).toContain(r.id);
    await decide(reviewer2, r.id, "approved", "ok");
    const after = await call(inbox.GET, "GET", "/i", { token: reviewer2.token, params: { ws: ws.slug } });
    expect(after.json.waitingForMe.map((x: { id: string }) => x.id)).not.toContain(r.id);
    expect(after.json.recentDecisions[0]).toMatchObject({ reviewId: r.id, verdict: "approved", user: { id: reviewer2.id }, revision: n });
    const asker = await call(inbox.GET, "GET", "/i", { token: designer.token, params: { ws: ws.slug } });
    expect(asker.json.askedByMe[0]).toMatchObject({ id: r.id, state: "approved" });
  });
});

describe("decisions are history, guarded by the database", () => {
  async function decidedReview() {
    const n = await save(designer, V1.replace("upper gate", `upper gate ${tag()}`), "history case");
    const r = (await ask(designer, n, [reviewer])).json.review;
    await comment(reviewer, r.id, "Noted", 2);
    await decide(reviewer, r.id, "changes-asked", "Rename the key input");
    return r.id as string;
  }
  // The app's own connection: its role lacks the right (or, for the state of a review, a trigger refuses).
  const refused = async (sql: string, replacements: Record<string, unknown>) => {
    await expect(db().sequelize.query(sql, { replacements })).rejects.toThrow(/permission denied|history|does not reopen|without a decision/);
  };

  it("UPDATE and DELETE of a decision are refused by the database, and the row is unchanged", async () => {
    const id = await decidedReview();
    await refused("UPDATE review_decisions SET note = 'approved really', verdict = 'approved' WHERE review_id = :id", { id });
    await refused("DELETE FROM review_decisions WHERE review_id = :id", { id });
    const rows = await db().sequelize.query<{ verdict: string; note: string }>("SELECT verdict::text, note FROM review_decisions WHERE review_id = :id", {
      replacements: { id }, type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([{ verdict: "changes-asked", note: "Rename the key input" }]);
    // The models say so before the database does.
    const row = await db().models.ReviewDecision.findOne({ where: { reviewId: id } });
    await expect(row!.update({ note: "x" })).rejects.toThrow(/history/);
    await expect(row!.destroy()).rejects.toThrow(/history/);
  });

  it("comments and the members asked are kept; a review is never deleted and a closed one never reopens", async () => {
    const id = await decidedReview();
    await refused("UPDATE review_comments SET body = 'never said' WHERE review_id = :id", { id });
    await refused("DELETE FROM review_comments WHERE review_id = :id", { id });
    await refused("DELETE FROM review_reviewers WHERE review_id = :id", { id });
    await refused("DELETE FROM reviews WHERE id = :id", { id });
    await refused("UPDATE reviews SET state = 'open' WHERE id = :id", { id });
    await refused("UPDATE reviews SET message = 'rewritten' WHERE id = :id", { id });
    expect((await getReview(reviewer, id)).json.review).toMatchObject({ state: "changes-asked", commentCount: 1 });
  });

  it.skipIf(!process.env.DATABASE_OWNER_URL)("as the owner role too, the triggers refuse changing, deleting or truncating the history", async () => {
    const id = await decidedReview();
    const owner = new Sequelize(process.env.DATABASE_OWNER_URL!, { dialect: "postgres", dialectModule: pg, logging: false });
    try {
      const q = (sql: string) => owner.query(sql, { replacements: { id } });
      await expect(q("UPDATE review_decisions SET note = 'approved really' WHERE review_id = :id")).rejects.toThrow(/review_decisions are history: UPDATE refused/);
      await expect(q("DELETE FROM review_decisions WHERE review_id = :id")).rejects.toThrow(/review_decisions are history: DELETE refused/);
      await expect(q("UPDATE review_comments SET body = 'never said' WHERE review_id = :id")).rejects.toThrow(/review_comments are history/);
      await expect(q("DELETE FROM review_reviewers WHERE review_id = :id")).rejects.toThrow(/review_reviewers are history/);
      await expect(q("DELETE FROM reviews WHERE id = :id")).rejects.toThrow(/reviews are history: DELETE refused/);
      await expect(q("UPDATE reviews SET state = 'open' WHERE id = :id")).rejects.toThrow(/does not reopen/);
      await expect(q("UPDATE reviews SET message = 'rewritten' WHERE id = :id")).rejects.toThrow(/only the state/);
      for (const t of ["reviews", "review_reviewers", "review_comments", "review_decisions"]) {
        await expect(owner.query(`TRUNCATE ${t} CASCADE`)).rejects.toThrow(/TRUNCATE refused/);
      }
    } finally {
      await owner.close();
    }
    expect((await getReview(reviewer, id)).json.review).toMatchObject({ state: "changes-asked", commentCount: 1, decisions: [expect.objectContaining({ note: "Rename the key input" })] });
  });

  it("an open review cannot be marked approved without an approval on record", async () => {
    const n = await save(designer, V2.replace("upper gate", `upper gate ${tag()}`), "no shortcut");
    const r = (await ask(designer, n, [reviewer])).json.review;
    await refused("UPDATE reviews SET state = 'approved' WHERE id = :id", { id: r.id });
    expect((await getReview(reviewer, r.id)).json.review.state).toBe("open");
  });
});

describe("comparing revisions from what they stored", () => {
  it("gives each side's stored figures, signed deltas, the source line diff and the gates added and removed", async () => {
    const a = await save(designer, V1, "compare a");
    const b = await save(designer, V2, "compare b");
    const res = await call(compareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId } });
    expect(res.status).toBe(200);
    // Defaults: the latest against the one before.
    expect([res.json.from.revision.number, res.json.to.revision.number]).toEqual([a, b]);
    const stored = async (n: number) => (await db().models.Revision.findOne({ where: { designId, number: n } }))!;
    const [ra, rb] = [await stored(a), await stored(b)];
    for (const [side, row] of [[res.json.from, ra], [res.json.to, rb]] as const) {
      for (const k of ["gates", "depth", "packages", "transistors", "delayNs", "staticMw", "dynamicMw", "maxLoad", "products", "literals"]) {
        expect(side.figures[k], k).toEqual(row.stats[k]);
      }
      expect(side.figures.outputs).toEqual(row.stats.byOutput);
      expect(side.netlist).toEqual((row.netlist as { document: unknown }).document);
      expect(side.critical).toEqual((row.netlist as { critical: unknown }).critical);
    }
    for (const f of res.json.comparison.figures) {
      const x = ra.stats[f.key] as number | null;
      const y = rb.stats[f.key] as number | null;
      if (x === null || y === null) expect(f.delta).toBeNull();
      else expect(f.delta).toBeCloseTo(y - x, 6);
    }
    // x·(y + k) = x·y + x·k: two products before, one after (distributive law, any textbook).
    expect(res.json.comparison.outputs).toEqual([expect.objectContaining({ name: "open_upper", from: expect.objectContaining({ products: 2 }), to: expect.objectContaining({ products: 1 }), direction: "better" })]);
    expect(res.json.source).toMatchObject({ added: 1, removed: 1 });
    expect(res.json.source.lines.find((l: { kind: string }) => l.kind === "added")).toMatchObject({ to: 4, text: "open_upper = estop' * lower_shut * level_upper" });
    const gatesDelta = res.json.comparison.figures.find((f: { key: string }) => f.key === "gates").delta;
    expect(res.json.comparison.netlist.added - res.json.comparison.netlist.removed).toBe(gatesDelta);

    const one = await call(figuresRoute.GET, "GET", "/f", { token: viewer.token, params: { ws: ws.slug, designId, number: String(a) } });
    expect(one.json.side).toEqual(res.json.from);
  });

  it("sets the unsaved draft against a stored revision, compiled on the one compile path", async () => {
    const a = await save(designer, V1, "draft base a");
    const b = await save(designer, V2, "draft base b");
    await db().models.Design.update({ draftSource: V1 }, { where: { id: designId } });
    const res = await call(draftCompareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId } });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    // Default: against the latest revision.
    expect(res.json.from.revision.number).toBe(b);
    expect(res.json.to.source).toBe(V1);
    // The draft is r(a)'s text with the same family and settings, so its fresh figures are the ones r(a) stored.
    const ra = (await db().models.Revision.findOne({ where: { designId, number: a } }))!;
    for (const k of ["gates", "depth", "packages", "transistors", "delayNs", "staticMw", "dynamicMw", "products", "literals"]) {
      expect(res.json.to.figures[k], k).toEqual(ra.stats[k]);
    }
    expect(res.json.to.figures.outputs).toEqual(ra.stats.byOutput);
    expect(res.json.comparison.family).toBeNull();
    expect(res.json.comparison.settings).toEqual([]);
    // x·y → x·(y + k): back to two products (distributive law, any textbook).
    expect(res.json.comparison.outputs).toEqual([expect.objectContaining({ name: "open_upper", from: expect.objectContaining({ products: 1 }), to: expect.objectContaining({ products: 2 }), direction: "worse" })]);
    expect(res.json.source).toMatchObject({ added: 1, removed: 1 });
    const pair = await call(compareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId }, query: { from: String(b), to: String(a) } });
    expect(res.json.comparison.figures).toEqual(pair.json.comparison.figures);

    const older = await call(draftCompareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId }, query: { from: String(a) } });
    expect(older.json.from.revision.number).toBe(a);
    expect(older.json.source).toMatchObject({ added: 0, removed: 0 });
    expect(older.json.comparison.figures.every((f: { delta: number | null }) => f.delta === 0 || f.delta === null)).toBe(true);

    await db().models.Design.update({ draftSource: V1.replace("outputs open_upper", "outputs open_upper\nopen_upper = nowhere") }, { where: { id: designId } });
    const broken = await call(draftCompareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId } });
    expect(broken.status).toBe(422);
    expect(broken.json.error.message).toMatch(/draft has errors/);
    expect(broken.json.error.details.diagnostics.length).toBeGreaterThan(0);
    await db().models.Design.update({ draftSource: V1 }, { where: { id: designId } });
  });

  it("says what to change when there is nothing before, or no such revision", async () => {
    const first = await call(compareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId }, query: { to: "1" } });
    expect(first.status).toBe(400);
    expect(first.json.error.message).toMatch(/first revision/);
    const none = await call(compareRoute.GET, "GET", "/c", { token: viewer.token, params: { ws: ws.slug, designId }, query: { from: "1", to: "999" } });
    expect(none.status).toBe(404);
  });
});

describe("the demo workspace tells a review story", () => {
  it("Ferrow controls holds an approved review and an open one whose line comments sit on the lines they discuss", async () => {
    const rows = await db().sequelize.query<{ id: string; state: string; design: string; source: string }>(
      `SELECT r.id, r.state::text AS state, d.name AS design, v.source FROM reviews r
       JOIN designs d ON d.id = r.design_id JOIN revisions v ON v.id = r.revision_id
       JOIN workspaces w ON w.id = d.workspace_id WHERE w.slug = 'ferrow-controls'`,
      { type: QueryTypes.SELECT },
    );
    expect(rows.some((r) => r.state === "approved")).toBe(true);
    const open = rows.find((r) => r.state === "open" && r.design === "Chamber interlock");
    expect(open).toBeDefined();
    const comments = await db().models.ReviewComment.findAll({ where: { reviewId: open!.id }, order: [["createdAt", "ASC"]] });
    const lines = open!.source.split("\n");
    const onLines = comments.filter((c) => c.line !== null);
    expect(onLines.length).toBeGreaterThanOrEqual(2);
    // The reviewer's question about the override key sits on the upper gate's permit.
    const key = onLines.find((c) => /override key bypass/.test(c.body))!;
    expect(lines[key.line! - 1]).toMatch(/^open_upper = .*override_key/);
    // The demo's decisions are on record like any other.
    const decided = rows.filter((r) => r.state !== "open");
    for (const r of decided) expect(await db().models.ReviewDecision.count({ where: { reviewId: r.id } })).toBeGreaterThan(0);
  });
});
