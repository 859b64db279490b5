/**
 * Every route × every actor: anonymous, viewer, reviewer, designer, owner of
 * the workspace, and the owner of another workspace. Expected statuses follow
 * the permission table of the issue (owner manages members, families and
 * settings; designer writes designs and revisions; reviewer and viewer read);
 * records of a workspace one does not belong to answer 404. Common practice,
 * no source beyond the issue text.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/lib/db/connection";
import { createRevision } from "@/lib/data/revisions";
import { publishBlock } from "@/lib/data/libraries";
import * as me from "@/app/api/v1/me/route";
import * as tokens from "@/app/api/v1/tokens/route";
import * as token from "@/app/api/v1/tokens/[id]/route";
import * as workspaces from "@/app/api/v1/workspaces/route";
import * as workspace from "@/app/api/v1/workspaces/[ws]/route";
import * as members from "@/app/api/v1/workspaces/[ws]/members/route";
import * as member from "@/app/api/v1/workspaces/[ws]/members/[userId]/route";
import * as invitations from "@/app/api/v1/workspaces/[ws]/invitations/route";
import * as invitation from "@/app/api/v1/workspaces/[ws]/invitations/[id]/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as resend from "@/app/api/v1/workspaces/[ws]/invitations/[id]/resend/route";
import * as activity from "@/app/api/v1/workspaces/[ws]/activity/route";
import * as familyMatrix from "@/app/api/v1/workspaces/[ws]/families/matrix/route";
import * as families from "@/app/api/v1/workspaces/[ws]/families/route";
import * as family from "@/app/api/v1/workspaces/[ws]/families/[familyId]/route";
import * as designs from "@/app/api/v1/workspaces/[ws]/designs/route";
import * as design from "@/app/api/v1/workspaces/[ws]/designs/[designId]/route";
import * as draft from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/route";
import * as revisions from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/route";
import * as revision from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/route";
import * as exporter from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/export/route";
import * as compile from "@/app/api/v1/compile/route";
import * as importDesign from "@/app/api/v1/workspaces/[ws]/designs/import/route";
import * as importPreview from "@/app/api/v1/import/route";
import * as table from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/table/route";
import * as endSessions from "@/app/api/v1/me/sessions/end/route";
import * as verifyEmail from "@/app/api/v1/auth/verify-email/route";
import * as compareRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/compare/route";
import * as draftCompareRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/compare/route";
import * as figuresRoute from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/figures/route";
import * as designReviews from "@/app/api/v1/workspaces/[ws]/designs/[designId]/reviews/route";
import * as inbox from "@/app/api/v1/workspaces/[ws]/reviews/route";
import * as reviewRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/route";
import * as commentsRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/comments/route";
import * as decisionsRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/decisions/route";
import * as withdrawRoute from "@/app/api/v1/workspaces/[ws]/reviews/[reviewId]/withdraw/route";
import { requestReview } from "@/lib/data/reviews";
import * as openapi from "@/app/api/v1/openapi.json/route";
import * as libraries from "@/app/api/v1/workspaces/[ws]/libraries/route";
import * as library from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/route";
import * as publish from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/route";
import * as libRevision from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/[number]/route";
import * as libShares from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/shares/route";
import * as libShare from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/shares/[workspace]/route";
import * as libResolve from "@/app/api/v1/workspaces/[ws]/libraries/resolve/route";
import * as libApproval from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/[number]/approval/route";
import { SOURCE, addMember, builtinFamily, call, makeInvitation, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

const ACTORS = ["anonymous", "other", "viewer", "reviewer", "designer", "owner"] as const;
type ActorName = (typeof ACTORS)[number];
type Statuses = [number, number, number, number, number, number];

let users: Record<Exclude<ActorName, "anonymous">, TestUser>;
let ws: { id: string; slug: string };
let otherWs: { id: string; slug: string };
let familyId: string;
let ownFamilyId: string;
let designId: string;
let reviewId: string;
/** A library of the workspace, one shared into it from the other workspace, and one of a third workspace shared with neither. */
let libraryId: string;
let sharedInId: string;
let hiddenId: string;
let shareTarget: { id: string; slug: string };

const BLOCK = "inputs a, b, c\noutputs m\nm = a * b + a * c + b * c\n";

const FAMILY_DATA = {
  supplyV: 5, vohMin: 4.4, volMax: 0.1, vihMin: 3.5, vilMax: 1.5,
  iohMa: -4, iolMa: 4, iihMa: 0.001, iilMa: -0.001,
  inputCapPf: 5, outputOhms: 50, maxTransitionNs: 15, intrinsicNs: 8, perLoadNs: 0.1, wiringPf: 2,
  staticMaPerGate: 0.001, powerCapPf: 20, fanIn: 4, source: "test family, figures from memory",
};

async function freshMember(role: "viewer" = "viewer") {
  const u = await makeUser("extra");
  await addMember(ws.id, u, role);
  return u;
}

async function freshFamily() {
  const f = await db().models.LogicFamilyRecord.create({
    workspaceId: ws.id, key: `fam-${tag()}`, name: `Test family ${tag()}`, builtin: false, data: { ...FAMILY_DATA },
  });
  return f.id;
}

beforeAll(async () => {
  const owner = await makeUser("owner");
  ws = await makeWorkspace("matrix", owner);
  const other = await makeUser("other");
  otherWs = await makeWorkspace("elsewhere", other);
  users = { owner, other, viewer: await makeUser("viewer"), reviewer: await makeUser("reviewer"), designer: await makeUser("designer") };
  await addMember(ws.id, users.viewer, "viewer");
  await addMember(ws.id, users.reviewer, "reviewer");
  await addMember(ws.id, users.designer, "designer");
  familyId = (await builtinFamily()).id;
  ownFamilyId = await freshFamily();
  const d = await db().models.Design.create({
    workspaceId: ws.id, name: `Upper gate ${tag()}`, description: "", familyId, settings: {}, draftSource: SOURCE, createdBy: owner.id, archivedAt: null,
  });
  designId = d.id;
  await createRevision({ actor: { userId: owner.id, via: "token" }, slug: ws.slug, designId, message: "first", source: SOURCE, familyId, settings: {} });
  const r2 = await designerRevision("second");
  reviewId = (await freshReview(r2, [users.reviewer.id])).id;
  const { Library, LibraryShare } = db().models;
  const lib = await Library.create({ workspaceId: ws.id, key: `blocks-${tag()}`, name: "Lock blocks", createdBy: owner.id });
  libraryId = lib.id;
  await publishBlock({ actor: { userId: owner.id, via: "token" }, slug: ws.slug, libraryId, block: "vote", source: BLOCK, familyId, settings: {}, message: "first" });
  const theirs = await Library.create({ workspaceId: otherWs.id, key: `weir-${tag()}`, name: "Weir blocks", createdBy: other.id });
  sharedInId = theirs.id;
  await publishBlock({ actor: { userId: other.id, via: "token" }, slug: otherWs.slug, libraryId: sharedInId, block: "vote", source: BLOCK, familyId, settings: {}, message: "first" });
  await LibraryShare.create({ libraryId: sharedInId, workspaceId: ws.id, createdBy: other.id });
  const third = await makeUser("third");
  const thirdWs = await makeWorkspace("third", third);
  hiddenId = (await Library.create({ workspaceId: thirdWs.id, key: `mill-${tag()}`, name: "Mill blocks", createdBy: third.id })).id;
  shareTarget = await makeWorkspace("target", await makeUser("target"));
});

/** A revision of block "vote" in a library, published by the designer awaiting review; its number. */
async function awaitingRevision(lib: string): Promise<number> {
  const { LibraryBlock, LibraryRevision } = db().models;
  const block = await LibraryBlock.findOne({ where: { libraryId: lib, name: "vote" } });
  const first = await LibraryRevision.findOne({ where: { blockId: block!.id, number: 1 } });
  const last = (await LibraryRevision.max("number", { where: { blockId: block!.id } })) as number;
  const { id: _id, createdAt: _c, number: _n, ...rest } = first!.get({ plain: true });
  await LibraryRevision.create({ ...rest, number: last + 1, authorId: users.designer.id, needsReview: true, message: "awaiting review" });
  return last + 1;
}

/** A new revision saved by the designer (so the reviewer and the owner may review it). */
async function designerRevision(message: string) {
  const r = await createRevision({
    actor: { userId: users.designer.id, via: "token" }, slug: ws.slug, designId, message, source: `${SOURCE}// ${message} ${tag()}\n`, familyId, settings: {},
  });
  return r.number;
}

/** An open review of revision `number`, asked by the designer. */
async function freshReview(number: number, reviewers: string[]) {
  const { review } = await requestReview({ actor: { userId: users.designer.id, via: "token" }, slug: ws.slug, designId, number, reviewers });
  return review;
}

beforeEach(async () => {
  await resetLimits();
});

afterAll(async () => {
  // Revisions are immutable, so their designs, families and users stay; the test database is recreated each run.
});

type Row = {
  name: string;
  run: (who: ActorName, token: string | null) => Promise<{ status: number; json: Record<string, unknown> | null }>;
  expect: Statuses;
};

const wsp = () => ({ ws: ws.slug });
const dp = () => ({ ws: ws.slug, designId });

const rows: Row[] = [
  { name: "GET /me", run: (_w, t) => call(me.GET, "GET", "/me", { token: t }), expect: [401, 200, 200, 200, 200, 200] },
  {
    // Ends the sessions of the caller's own account only; the matrix actors use API tokens, which stay.
    name: "POST /me/sessions/end",
    run: (_w, t) => call(endSessions.POST, "POST", "/me/sessions/end", { token: t, body: {} }),
    expect: [401, 200, 200, 200, 200, 200],
  },
  {
    // Public: the secret from the mail is the only credential, so everyone gets the same 400 for a wrong one.
    name: "POST /auth/verify-email (unknown secret)",
    run: (_w, t) => call(verifyEmail.POST, "POST", "/auth/verify-email", { token: t, body: { token: `x${tag()}${tag()}` } }),
    expect: [400, 400, 400, 400, 400, 400],
  },
  { name: "GET /tokens", run: (_w, t) => call(tokens.GET, "GET", "/tokens", { token: t }), expect: [401, 200, 200, 200, 200, 200] },
  {
    name: "POST /tokens",
    run: (_w, t) => call(tokens.POST, "POST", "/tokens", { token: t, body: { name: "ci", expiresAt: new Date(Date.now() + 86_400_000).toISOString() } }),
    expect: [401, 201, 201, 201, 201, 201],
  },
  {
    name: "DELETE /tokens/{id} (someone else's token)",
    run: async (_w, t) => {
      const u = await makeUser("bystander");
      const row = await db().models.ApiToken.findOne({ where: { userId: u.id } });
      return call(token.DELETE, "DELETE", `/tokens/${row!.id}`, { token: t, params: { id: row!.id } });
    },
    expect: [401, 404, 404, 404, 404, 404],
  },
  { name: "GET /workspaces", run: (_w, t) => call(workspaces.GET, "GET", "/workspaces", { token: t }), expect: [401, 200, 200, 200, 200, 200] },
  {
    name: "POST /workspaces",
    run: (_w, t) => call(workspaces.POST, "POST", "/workspaces", { token: t, body: { name: "New", slug: `new-${tag()}` } }),
    expect: [401, 201, 201, 201, 201, 201],
  },
  { name: "GET /workspaces/{ws}", run: (_w, t) => call(workspace.GET, "GET", `/workspaces/${ws.slug}`, { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "PATCH /workspaces/{ws}",
    run: (_w, t) => call(workspace.PATCH, "PATCH", `/workspaces/${ws.slug}`, { token: t, params: wsp(), body: { settings: { note: "x" } } }),
    expect: [401, 404, 403, 403, 403, 200],
  },
  { name: "GET members", run: (_w, t) => call(members.GET, "GET", "/m", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "PATCH members/{userId}",
    run: async (_w, t) => {
      const u = await freshMember();
      return call(member.PATCH, "PATCH", "/m", { token: t, params: { ...wsp(), userId: u.id }, body: { role: "reviewer" } });
    },
    expect: [401, 404, 403, 403, 403, 200],
  },
  {
    name: "DELETE members/{userId}",
    run: async (_w, t) => {
      const u = await freshMember();
      return call(member.DELETE, "DELETE", "/m", { token: t, params: { ...wsp(), userId: u.id } });
    },
    expect: [401, 404, 403, 403, 403, 200],
  },
  { name: "GET invitations", run: (_w, t) => call(invitations.GET, "GET", "/i", { token: t, params: wsp() }), expect: [401, 404, 403, 403, 403, 200] },
  {
    name: "POST invitations",
    run: (_w, t) => call(invitations.POST, "POST", "/i", { token: t, params: wsp(), body: { email: `invitee-${tag()}@test.ferrow.example`, role: "viewer" } }),
    expect: [401, 404, 403, 403, 403, 201],
  },
  {
    name: "DELETE invitations/{id}",
    run: async (_w, t) => {
      const inv = await makeInvitation(ws.id, users.owner, `gone-${tag()}@test.ferrow.example`);
      return call(invitation.DELETE, "DELETE", "/i", { token: t, params: { ...wsp(), id: inv.id } });
    },
    expect: [401, 404, 403, 403, 403, 200],
  },
  {
    name: "POST invitations/{id}/resend",
    run: async (_w, t) => {
      const inv = await makeInvitation(ws.id, users.owner, `again-${tag()}@test.ferrow.example`);
      return call(resend.POST, "POST", "/i", { token: t, params: { ...wsp(), id: inv.id } });
    },
    expect: [401, 404, 403, 403, 403, 200],
  },
  { name: "GET activity", run: (_w, t) => call(activity.GET, "GET", "/a", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST /invitations/accept (invited to a new workspace)",
    run: async (who, t) => {
      const host = await makeUser("host");
      const w = await makeWorkspace("host", host);
      const email = who === "anonymous" ? `nobody-${tag()}@test.ferrow.example` : users[who].email;
      const inv = await makeInvitation(w.id, host, email);
      return call(accept.POST, "POST", "/invitations/accept", { token: t, body: { token: inv.secret } });
    },
    expect: [401, 200, 200, 200, 200, 200],
  },
  { name: "GET families", run: (_w, t) => call(families.GET, "GET", "/f", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST families",
    run: (_w, t) => call(families.POST, "POST", "/f", { token: t, params: wsp(), body: { key: `k-${tag()}`, name: "Bench CMOS", data: FAMILY_DATA } }),
    expect: [401, 404, 403, 403, 403, 201],
  },
  {
    name: "POST families (a copy of a built-in)",
    run: (_w, t) => call(families.POST, "POST", "/f", { token: t, params: wsp(), body: { key: `copy-${tag()}`, name: "Bench copy", copyOf: familyId } }),
    expect: [401, 404, 403, 403, 403, 201],
  },
  { name: "GET families/matrix", run: (_w, t) => call(familyMatrix.GET, "GET", "/f", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "PATCH families/{id} (archive)",
    run: async (_w, t) => call(family.PATCH, "PATCH", "/f", { token: t, params: { ...wsp(), familyId: await freshFamily() }, body: { archived: true } }),
    expect: [401, 404, 403, 403, 403, 200],
  },
  { name: "GET families/{id}", run: (_w, t) => call(family.GET, "GET", "/f", { token: t, params: { ...wsp(), familyId: ownFamilyId } }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "PATCH families/{id}",
    run: (_w, t) => call(family.PATCH, "PATCH", "/f", { token: t, params: { ...wsp(), familyId: ownFamilyId }, body: { name: `Renamed ${tag()}` } }),
    expect: [401, 404, 403, 403, 403, 200],
  },
  {
    name: "DELETE families/{id}",
    run: async (_w, t) => call(family.DELETE, "DELETE", "/f", { token: t, params: { ...wsp(), familyId: await freshFamily() } }),
    expect: [401, 404, 403, 403, 403, 200],
  },
  { name: "GET designs", run: (_w, t) => call(designs.GET, "GET", "/d", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST designs",
    run: (_w, t) => call(designs.POST, "POST", "/d", { token: t, params: wsp(), body: { name: `Lamp decode ${tag()}`, familyId } }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  { name: "GET designs/{id}", run: (_w, t) => call(design.GET, "GET", "/d", { token: t, params: dp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "PATCH designs/{id}",
    run: (_w, t) => call(design.PATCH, "PATCH", "/d", { token: t, params: dp(), body: { description: `edited ${tag()}` } }),
    expect: [401, 404, 403, 403, 200, 200],
  },
  {
    name: "PUT designs/{id}/draft",
    run: async (_w, t) => {
      const current = (await db().models.Design.findByPk(designId))!;
      return call(draft.PUT, "PUT", "/d", {
        token: t, params: dp(),
        body: { source: `${SOURCE}// edited ${tag()}\n`, familyId, settings: {}, baseVersion: current.draftVersion },
      });
    },
    expect: [401, 404, 403, 403, 200, 200],
  },
  { name: "GET revisions", run: (_w, t) => call(revisions.GET, "GET", "/r", { token: t, params: dp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST revisions",
    run: (_w, t) => call(revisions.POST, "POST", "/r", { token: t, params: dp(), body: { message: "matrix save", source: SOURCE, familyId, settings: {} } }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  { name: "GET revisions/{n}", run: (_w, t) => call(revision.GET, "GET", "/r", { token: t, params: { ...dp(), number: "1" } }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "GET revisions/{n}/export",
    run: (_w, t) => call(exporter.GET, "GET", "/r", { token: t, params: { ...dp(), number: "1" }, query: { format: "verilog" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "POST designs/import (a truth table)",
    run: (_w, t) => call(importDesign.POST, "POST", "/d/import", {
      token: t, params: wsp(), body: { kind: "csv", text: "a,b,y\n0,0,0\n0,1,1\n1,0,1\n1,1,0\n", name: `Imported ${tag()}`, familyId },
    }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  {
    name: "POST designs/import (a Verilog module)",
    run: (_w, t) => call(importDesign.POST, "POST", "/d/import", {
      token: t, params: wsp(), body: { kind: "verilog", text: "module m(input a, output y);\nassign y = ~a;\nendmodule\n", name: `Imported ${tag()}`, familyId },
    }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  {
    name: "GET revisions/{n}/table",
    run: (_w, t) => call(table.GET, "GET", "/r", { token: t, params: { ...dp(), number: "1" }, query: { format: "csv" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "POST /import (preview, nothing saved)",
    run: (_w, t) => call(importPreview.POST, "POST", "/import", { token: t, body: { kind: "csv", text: "a,y\n0,1\n1,0\n" } }),
    expect: [401, 200, 200, 200, 200, 200],
  },
  {
    name: "GET designs/{id}/compare",
    run: (_w, t) => call(compareRoute.GET, "GET", "/c", { token: t, params: dp(), query: { from: "1", to: "2" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "GET designs/{id}/draft/compare (the draft against r1, compiled)",
    run: (_w, t) => call(draftCompareRoute.GET, "GET", "/c", { token: t, params: dp(), query: { from: "1" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "GET revisions/{n}/figures",
    run: (_w, t) => call(figuresRoute.GET, "GET", "/r", { token: t, params: { ...dp(), number: "1" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  { name: "GET designs/{id}/reviews", run: (_w, t) => call(designReviews.GET, "GET", "/rv", { token: t, params: dp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST designs/{id}/reviews (ask the reviewer)",
    run: async (_w, t) => {
      const n = await designerRevision("to review");
      return call(designReviews.POST, "POST", "/rv", { token: t, params: dp(), body: { revision: n, reviewers: [users.reviewer.id], message: "please look" } });
    },
    expect: [401, 404, 403, 403, 201, 201],
  },
  { name: "GET reviews (inbox)", run: (_w, t) => call(inbox.GET, "GET", "/rv", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "GET reviews/{id}",
    run: (_w, t) => call(reviewRoute.GET, "GET", "/rv", { token: t, params: { ...wsp(), reviewId } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "POST reviews/{id}/comments",
    run: (_w, t) => call(commentsRoute.POST, "POST", "/rv", { token: t, params: { ...wsp(), reviewId }, body: { body: "Why two levels here?", line: 2 } }),
    expect: [401, 404, 403, 201, 201, 201],
  },
  {
    name: "POST reviews/{id}/decisions (reviewer and owner asked; the designer wrote it)",
    run: async (_w, t) => {
      const r = await freshReview(await designerRevision("decide"), [users.reviewer.id, users.owner.id]);
      return call(decisionsRoute.POST, "POST", "/rv", { token: t, params: { ...wsp(), reviewId: r.id }, body: { verdict: "approved", note: "fine" } });
    },
    expect: [401, 404, 403, 201, 403, 201],
  },
  {
    name: "POST reviews/{id}/withdraw (asked by the designer)",
    run: async (_w, t) => {
      const r = await freshReview(await designerRevision("withdraw"), [users.reviewer.id]);
      return call(withdrawRoute.POST, "POST", "/rv", { token: t, params: { ...wsp(), reviewId: r.id }, body: { note: "not ready" } });
    },
    expect: [401, 404, 403, 403, 200, 200],
  },
  {
    name: "POST /compile (built-in family by key)",
    run: (_w, t) => call(compile.POST, "POST", "/compile", { token: t, body: { source: SOURCE, familyKey: "cmos-hc-5v" } }),
    expect: [401, 200, 200, 200, 200, 200],
  },
  {
    name: "POST /compile (a workspace's own family)",
    run: (_w, t) => call(compile.POST, "POST", "/compile", { token: t, body: { source: SOURCE, familyId: ownFamilyId } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  { name: "GET libraries", run: (_w, t) => call(libraries.GET, "GET", "/l", { token: t, params: wsp() }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST libraries",
    run: (_w, t) => call(libraries.POST, "POST", "/l", { token: t, params: wsp(), body: { key: `lib-${tag()}`, name: "Spare blocks" } }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  { name: "GET libraries/{id}", run: (_w, t) => call(library.GET, "GET", "/l", { token: t, params: { ...wsp(), libraryId } }), expect: [401, 404, 200, 200, 200, 200] },
  {
    name: "POST libraries/{id}/blocks/{block}/revisions (publish)",
    run: (_w, t) => call(publish.POST, "POST", "/p", { token: t, params: { ...wsp(), libraryId, block: "vote" }, body: { source: BLOCK, familyId, message: "matrix publish" } }),
    expect: [401, 404, 403, 403, 201, 201],
  },
  {
    name: "GET libraries/{id}/blocks/{block}/revisions/{n}",
    run: (_w, t) => call(libRevision.GET, "GET", "/r", { token: t, params: { ...wsp(), libraryId, block: "vote", number: "1" } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "POST libraries/{id}/shares",
    run: async (_w, t) => {
      const target = await makeWorkspace("target", await makeUser("target"));
      return call(libShares.POST, "POST", "/s", { token: t, params: { ...wsp(), libraryId }, body: { workspace: target.slug } });
    },
    expect: [401, 404, 403, 403, 403, 201],
  },
  {
    name: "DELETE libraries/{id}/shares/{workspace}",
    run: async (_w, t) => {
      await db().models.LibraryShare.findOrCreate({ where: { libraryId, workspaceId: shareTarget.id }, defaults: { libraryId, workspaceId: shareTarget.id, createdBy: users.owner.id } });
      return call(libShare.DELETE, "DELETE", "/s", { token: t, params: { ...wsp(), libraryId, workspace: shareTarget.slug } });
    },
    expect: [401, 404, 403, 403, 403, 200],
  },
  {
    name: "POST libraries/resolve",
    run: (_w, t) => call(libResolve.POST, "POST", "/r", { token: t, params: wsp(), body: { uses: [{ library: "x", block: "vote", revision: 1 }] } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    // Shared into this workspace by the other one: its members read it; the other owner, not a member here, finds nothing.
    name: "GET libraries/{id} (shared in from another workspace)",
    run: (_w, t) => call(library.GET, "GET", "/l", { token: t, params: { ...wsp(), libraryId: sharedInId } }),
    expect: [401, 404, 200, 200, 200, 200],
  },
  {
    name: "POST publish to a library shared in (read-only)",
    run: (_w, t) => call(publish.POST, "POST", "/p", { token: t, params: { ...wsp(), libraryId: sharedInId, block: "vote" }, body: { source: BLOCK, familyId, message: "x" } }),
    expect: [401, 404, 403, 403, 403, 403],
  },
  {
    name: "POST shares of a library shared in (read-only)",
    run: (_w, t) => call(libShares.POST, "POST", "/s", { token: t, params: { ...wsp(), libraryId: sharedInId }, body: { workspace: shareTarget.slug } }),
    expect: [401, 404, 403, 403, 403, 403],
  },
  {
    name: "GET libraries/{id} of a workspace that shares nothing with this one",
    run: (_w, t) => call(library.GET, "GET", "/l", { token: t, params: { ...wsp(), libraryId: hiddenId } }),
    expect: [401, 404, 404, 404, 404, 404],
  },
  {
    name: "POST publish to a library of a workspace that shares nothing with this one",
    run: (_w, t) => call(publish.POST, "POST", "/p", { token: t, params: { ...wsp(), libraryId: hiddenId, block: "vote" }, body: { source: BLOCK, familyId, message: "x" } }),
    expect: [401, 404, 403, 403, 404, 404],
  },
  {
    // A revision the designer published while the workspace asked for reviews: those who may approve do, the author never.
    name: "POST libraries/{id}/blocks/{block}/revisions/{n}/approval",
    run: async (_w, t) => {
      const n = await awaitingRevision(libraryId);
      return call(libApproval.POST, "POST", "/a", { token: t, params: { ...wsp(), libraryId, block: "vote", number: String(n) }, body: { note: "matrix" } });
    },
    expect: [401, 404, 403, 201, 403, 201],
  },
  {
    name: "POST approval in a library shared in (read-only)",
    run: async (_w, t) => {
      const n = await awaitingRevision(sharedInId);
      return call(libApproval.POST, "POST", "/a", { token: t, params: { ...wsp(), libraryId: sharedInId, block: "vote", number: String(n) }, body: {} });
    },
    expect: [401, 404, 403, 403, 403, 403],
  },
  { name: "GET /openapi.json", run: (_w, t) => call(openapi.GET, "GET", "/openapi.json", { token: t }), expect: [200, 200, 200, 200, 200, 200] },
];

describe("route × actor matrix", () => {
  for (const row of rows) {
    it(row.name, async () => {
      const got: Record<string, number> = {};
      const want: Record<string, number> = {};
      for (const [i, who] of ACTORS.entries()) {
        const res = await row.run(who, who === "anonymous" ? null : users[who].token);
        got[who] = res.status;
        want[who] = row.expect[i]!;
        if (res.status >= 400) {
          // Every refusal comes in the one error shape.
          expect(res.json?.error, `${row.name} as ${who}`).toMatchObject({ code: expect.any(String), message: expect.any(String) });
        }
      }
      expect(got).toEqual(want);
    });
  }
});

describe("records of another workspace are invisible (404) and unchanged", () => {
  it("the other owner cannot reach this workspace's records through their own slug", async () => {
    const t = users.other.token;
    const op = { ws: otherWs.slug };
    const before = await db().models.Design.findByPk(designId);
    const results = [
      await call(design.GET, "GET", "/d", { token: t, params: { ...op, designId } }),
      await call(design.PATCH, "PATCH", "/d", { token: t, params: { ...op, designId }, body: { name: "stolen" } }),
      await call(draft.PUT, "PUT", "/d", { token: t, params: { ...op, designId }, body: { source: "stolen", familyId, settings: {}, baseVersion: 1 } }),
      await call(revisions.GET, "GET", "/r", { token: t, params: { ...op, designId } }),
      await call(revisions.POST, "POST", "/r", { token: t, params: { ...op, designId }, body: { message: "x", source: SOURCE, familyId, settings: {} } }),
      await call(revision.GET, "GET", "/r", { token: t, params: { ...op, designId, number: "1" } }),
      await call(exporter.GET, "GET", "/r", { token: t, params: { ...op, designId, number: "1" }, query: { format: "csv" } }),
      await call(table.GET, "GET", "/r", { token: t, params: { ...op, designId, number: "1" }, query: { format: "csv" } }),
      await call(family.GET, "GET", "/f", { token: t, params: { ...op, familyId: ownFamilyId } }),
      await call(family.PATCH, "PATCH", "/f", { token: t, params: { ...op, familyId: ownFamilyId }, body: { name: "stolen" } }),
      await call(family.DELETE, "DELETE", "/f", { token: t, params: { ...op, familyId: ownFamilyId } }),
      await call(member.PATCH, "PATCH", "/m", { token: t, params: { ...op, userId: users.viewer.id }, body: { role: "owner" } }),
      await call(member.DELETE, "DELETE", "/m", { token: t, params: { ...op, userId: users.viewer.id } }),
      await call(compareRoute.GET, "GET", "/c", { token: t, params: { ...op, designId } }),
      await call(draftCompareRoute.GET, "GET", "/c", { token: t, params: { ...op, designId } }),
      await call(figuresRoute.GET, "GET", "/r", { token: t, params: { ...op, designId, number: "1" } }),
      await call(designReviews.GET, "GET", "/rv", { token: t, params: { ...op, designId } }),
      await call(designReviews.POST, "POST", "/rv", { token: t, params: { ...op, designId }, body: { revision: 1, reviewers: [users.other.id] } }),
      await call(reviewRoute.GET, "GET", "/rv", { token: t, params: { ...op, reviewId } }),
      await call(commentsRoute.POST, "POST", "/rv", { token: t, params: { ...op, reviewId }, body: { body: "stolen" } }),
      await call(decisionsRoute.POST, "POST", "/rv", { token: t, params: { ...op, reviewId }, body: { verdict: "approved" } }),
      await call(withdrawRoute.POST, "POST", "/rv", { token: t, params: { ...op, reviewId }, body: {} }),
      await call(resend.POST, "POST", "/i", { token: t, params: { ...op, id: (await makeInvitation(ws.id, users.owner, `kept-${tag()}@test.ferrow.example`)).id } }),
      await call(invitation.DELETE, "DELETE", "/i", { token: t, params: { ...op, id: (await makeInvitation(ws.id, users.owner, `kept-${tag()}@test.ferrow.example`)).id } }),
    ];
    expect(results.map((r) => r.status)).toEqual(results.map(() => 404));
    const after = await db().models.Design.findByPk(designId);
    expect(after!.name).toBe(before!.name);
    expect(after!.draftSource).toBe(before!.draftSource);
    expect((await db().models.LogicFamilyRecord.findByPk(ownFamilyId))).not.toBeNull();
    const m = await db().models.Membership.findOne({ where: { workspaceId: ws.id, userId: users.viewer.id } });
    expect(m!.role).toBe("viewer");
  });

  it("a design cannot be pointed at another workspace's family", async () => {
    const foreign = await db().models.LogicFamilyRecord.create({
      workspaceId: otherWs.id, key: `foreign-${tag()}`, name: "Foreign", builtin: false, data: { ...FAMILY_DATA },
    });
    const current = (await db().models.Design.findByPk(designId))!;
    const r = await call(draft.PUT, "PUT", "/d", {
      token: users.owner.token, params: dp(), body: { source: SOURCE, familyId: foreign.id, settings: {}, baseVersion: current.draftVersion },
    });
    expect(r.status).toBe(400);
    const c = await call(compile.POST, "POST", "/compile", { token: users.owner.token, body: { source: SOURCE, familyId: foreign.id } });
    expect(c.status).toBe(404);
  });
});
