/**
 * Workspace administration on the real database: the activity list (stored,
 * append-only, paged, recorded by the data layer), invitations sent again,
 * families copied, edited, archived, and the compatibility matrix and design
 * boundaries through the API. Statuses per actor are in matrix.test.ts.
 */
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { QueryTypes, Sequelize } from "sequelize";
import pg from "pg";
import { db } from "@/lib/db/connection";
import { acceptInvitation } from "@/lib/data/invitations";
import * as activity from "@/app/api/v1/workspaces/[ws]/activity/route";
import * as invitations from "@/app/api/v1/workspaces/[ws]/invitations/route";
import * as invitation from "@/app/api/v1/workspaces/[ws]/invitations/[id]/route";
import * as resend from "@/app/api/v1/workspaces/[ws]/invitations/[id]/resend/route";
import * as member from "@/app/api/v1/workspaces/[ws]/members/[userId]/route";
import * as families from "@/app/api/v1/workspaces/[ws]/families/route";
import * as family from "@/app/api/v1/workspaces/[ws]/families/[familyId]/route";
import * as familyMatrix from "@/app/api/v1/workspaces/[ws]/families/matrix/route";
import * as designs from "@/app/api/v1/workspaces/[ws]/designs/route";
import * as design from "@/app/api/v1/workspaces/[ws]/designs/[designId]/route";
import * as draft from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/route";
import * as revisions from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/route";
import * as revision from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/route";
import * as compile from "@/app/api/v1/compile/route";
import * as draftCompare from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/compare/route";
import { enforceLimits, LIMITS } from "@/lib/api/rate-limit";
import { SOURCE, addMember, builtinFamily, call, linkIn, mailTo, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

let owner: TestUser;
let viewer: TestUser;
let ws: { id: string; slug: string };
let hcId: string;

beforeAll(async () => {
  owner = await makeUser("owner");
  viewer = await makeUser("viewer");
  ws = await makeWorkspace("admin", owner);
  await addMember(ws.id, viewer, "viewer");
  hcId = (await builtinFamily("cmos-hc-5v")).id;
});

beforeEach(async () => {
  await resetLimits();
});

const p = () => ({ ws: ws.slug });
/** Writes a design's draft the way the workbench does: text, family and settings together, from the version last seen. */
async function putDraft(designId: string, body: { source?: string; familyId: string; settings?: Record<string, unknown> }) {
  const now = await call(design.GET, "GET", "/d", { token: owner.token, params: { ...p(), designId } });
  return call(draft.PUT, "PUT", "/d", {
    token: owner.token, params: { ...p(), designId },
    body: { source: body.source ?? now.json.design.draftSource, familyId: body.familyId, settings: body.settings ?? {}, baseVersion: now.json.design.draftVersion },
  });
}
async function entries(token = owner.token, query: Record<string, string> = { limit: "200" }) {
  const r = await call(activity.GET, "GET", "/a", { token, params: p(), query });
  expect(r.status).toBe(200);
  return r.json as { items: Array<{ action: string; summary: string; actor: { id: string } | null; subject: { kind: string; label: string }; details: Record<string, unknown> }>; nextCursor: string | null };
}

describe("the activity list is append-only in the database", () => {
  async function someEntry() {
    const u = await makeUser("guard");
    await addMember(ws.id, u, "viewer");
    await call(member.PATCH, "PATCH", "/m", { token: owner.token, params: { ...p(), userId: u.id }, body: { role: "reviewer" } });
    const [row] = await db().sequelize.query<{ id: string }>("SELECT id FROM activity WHERE workspace_id = :ws LIMIT 1", {
      replacements: { ws: ws.id }, type: QueryTypes.SELECT,
    });
    expect(row).toBeDefined();
    return row!.id;
  }

  it("the app's role may read and add entries, never change, delete or empty them; the model says so first", async () => {
    const id = await someEntry();
    const { sequelize } = db();
    // Like revisions (migrations/20261215090000-sessions-limits-and-rights.mjs): the app role lacks the right, and the trigger stands behind it.
    await expect(sequelize.query("UPDATE activity SET action = 'forged' WHERE id = :id", { replacements: { id } })).rejects.toThrow(/permission denied|append-only/);
    await expect(sequelize.query("DELETE FROM activity WHERE id = :id", { replacements: { id } })).rejects.toThrow(/permission denied|append-only/);
    await expect(sequelize.query("TRUNCATE activity")).rejects.toThrow(/permission denied|append-only/);
    const [[rights]] = (await sequelize.query(
      `SELECT has_table_privilege(current_user, 'activity', 'UPDATE') AS u, has_table_privilege(current_user, 'activity', 'DELETE') AS d,
              has_table_privilege(current_user, 'activity', 'TRUNCATE') AS t, has_table_privilege(current_user, 'activity', 'INSERT') AS i,
              has_table_privilege(current_user, 'activity', 'SELECT') AS s`,
    )) as [Array<Record<string, boolean>>, unknown];
    expect(rights).toEqual({ u: false, d: false, t: false, i: true, s: true });
    const model = await db().models.Activity.findByPk(id);
    await expect(model!.update({ action: "forged" })).rejects.toThrow(/append-only/);
    await expect(model!.destroy()).rejects.toThrow(/append-only/);
    await expect(db().models.Activity.destroy({ where: { id } })).rejects.toThrow(/append-only/);
    expect((await db().models.Activity.findByPk(id))!.action).not.toBe("forged");
  });

  it.skipIf(!process.env.DATABASE_OWNER_URL)("as the owner role too, UPDATE, DELETE and TRUNCATE are refused by the triggers", async () => {
    const id = await someEntry();
    const ownerDb = new Sequelize(process.env.DATABASE_OWNER_URL!, { dialect: "postgres", dialectModule: pg, logging: false });
    try {
      await expect(ownerDb.query("UPDATE activity SET action = 'forged' WHERE id = :id", { replacements: { id } })).rejects.toThrow(/append-only: UPDATE refused/);
      await expect(ownerDb.query("DELETE FROM activity WHERE id = :id", { replacements: { id } })).rejects.toThrow(/append-only: DELETE refused/);
      await expect(ownerDb.query("TRUNCATE activity")).rejects.toThrow(/append-only: TRUNCATE refused/);
    } finally {
      await ownerDb.close();
    }
    expect((await db().models.Activity.findByPk(id))!.action).toBe("member.role");
  });
});

describe("memberships and invitations are recorded", () => {
  it("role changes, removals, invitations, resends, cancellations and joins, newest first, with who did them", async () => {
    const u = await makeUser("keeper");
    await addMember(ws.id, u, "viewer");
    expect((await call(member.PATCH, "PATCH", "/m", { token: owner.token, params: { ...p(), userId: u.id }, body: { role: "designer" } })).status).toBe(200);
    // the same role again changes nothing and records nothing
    await call(member.PATCH, "PATCH", "/m", { token: owner.token, params: { ...p(), userId: u.id }, body: { role: "designer" } });
    expect((await call(member.DELETE, "DELETE", "/m", { token: owner.token, params: { ...p(), userId: u.id } })).status).toBe(200);
    const invitee = `lockkeeper-${tag()}@test.ferrow.example`;
    const inv = await call(invitations.POST, "POST", "/i", { token: owner.token, params: p(), body: { email: invitee, role: "reviewer" } });
    expect(inv.status).toBe(201);
    const cancelled = `gone-${tag()}@test.ferrow.example`;
    const inv2 = await call(invitations.POST, "POST", "/i", { token: owner.token, params: p(), body: { email: cancelled, role: "viewer" } });
    expect((await call(invitation.DELETE, "DELETE", "/i", { token: owner.token, params: { ...p(), id: inv2.json.invitation.id } })).status).toBe(200);

    const list = (await entries()).items;
    const mine = list.filter((e) => [u.email, invitee, cancelled].some((x) => e.subject.label.includes(x)));
    expect(mine.map((e) => e.action)).toEqual(["invitation.revoke", "invitation.create", "invitation.create", "member.remove", "member.role"]);
    expect(mine.every((e) => e.actor?.id === owner.id)).toBe(true);
    const role = mine.find((e) => e.action === "member.role")!;
    expect(role.details).toEqual({ from: "viewer", to: "designer" });
    expect(role.summary).toBe(`changed the role of ${u.name} (${u.email}) from viewer to designer`);
    expect(mine.find((e) => e.action === "member.remove")!.summary).toMatch(/removed .* from the workspace \(was designer\)/);
  });

  it("resending gives a new link, and the old one stops working", async () => {
    const guest = await makeUser("guest");
    // Acceptance wants an address shown to be the invitee's (a link mailed to it); this one is.
    await db().models.User.update({ emailVerifiedAt: new Date() }, { where: { id: guest.id } });
    const r = await call(invitations.POST, "POST", "/i", { token: owner.token, params: p(), body: { email: guest.email, role: "designer" } });
    const first = linkIn((await mailTo(guest.email)).text).searchParams.get("token")!;
    const again = await call(resend.POST, "POST", "/i", { token: owner.token, params: { ...p(), id: r.json.invitation.id } });
    expect(again.status).toBe(200);
    expect(again.json.invitation.status).toBe("open");
    // The catcher keeps each message; the newest to this address is the one sent again.
    let second = first;
    for (let i = 0; i < 50 && second === first; i++) {
      const m = await mailTo(guest.email);
      second = linkIn(m.text).searchParams.get("token")!;
      if (second !== first) expect(m.text).toMatch(/replaces the one sent before/);
      else await new Promise((res) => setTimeout(res, 100));
    }
    expect(second).not.toBe(first);
    await expect(acceptInvitation({ actor: { userId: guest.id, via: "token" }, token: first })).rejects.toMatchObject({ code: "not_found" });
    const joined = await acceptInvitation({ actor: { userId: guest.id, via: "token" }, token: second });
    expect(joined.workspace).toMatchObject({ slug: ws.slug, role: "designer" });
    const list = (await entries()).items.filter((e) => e.subject.label.includes(guest.email));
    expect(list.map((e) => e.action)).toEqual(["member.join", "invitation.resend", "invitation.create"]);
    expect(list[0]!.actor?.id).toBe(guest.id);
    // an accepted invitation cannot be sent again
    expect((await call(resend.POST, "POST", "/i", { token: owner.token, params: { ...p(), id: r.json.invitation.id } })).status).toBe(409);
  });

  it("invitation mail, new or sent again, counts against the owner's own limit", async () => {
    // Another owner, so this test's count starts at zero whatever the others sent.
    const busy = await makeUser("busy-owner");
    const w = await makeWorkspace("busy", busy);
    const first = await call(invitations.POST, "POST", "/i", { token: busy.token, params: { ws: w.slug }, body: { email: `crew-${tag()}@test.ferrow.example`, role: "viewer" } });
    expect(first.status).toBe(201);
    expect((await call(resend.POST, "POST", "/i", { token: busy.token, params: { ws: w.slug, id: first.json.invitation.id } })).status).toBe(200);
    // The rest of the hour's allowance spent as the routes spend it; had either call above not counted, one would be left.
    for (let i = 2; i < LIMITS.invitationMail.points; i++) await enforceLimits(["invitationMail"], { caller: "direct", userId: busy.id });
    const refused = await call(invitations.POST, "POST", "/i", { token: busy.token, params: { ws: w.slug }, body: { email: `crew-${tag()}@test.ferrow.example`, role: "viewer" } });
    expect(refused.status).toBe(429);
    expect(refused.json.error).toMatchObject({ code: "rate_limited", details: { limit: "invitationMail" } });
    expect((await call(resend.POST, "POST", "/i", { token: busy.token, params: { ws: w.slug, id: first.json.invitation.id } })).status).toBe(429);
    // The workspace's other owner is not held back by it.
    expect((await call(invitations.POST, "POST", "/i", { token: owner.token, params: p(), body: { email: `crew-${tag()}@test.ferrow.example`, role: "viewer" } })).status).toBe(201);
  });

  it("a viewer reads the list without the entries about invitations; another workspace's list is its own", async () => {
    const all = (await entries(owner.token)).items;
    const seen = (await entries(viewer.token)).items;
    expect(all.some((e) => e.subject.kind === "invitation")).toBe(true);
    expect(seen.some((e) => e.subject.kind === "invitation")).toBe(false);
    expect(seen.length).toBe(all.filter((e) => e.subject.kind !== "invitation").length);
    const other = await makeUser("other");
    const otherWs = await makeWorkspace("other", other);
    const theirs = await call(activity.GET, "GET", "/a", { token: other.token, params: { ws: otherWs.slug } });
    expect(theirs.json.items).toEqual([]);
    expect((await call(activity.GET, "GET", "/a", { token: other.token, params: p() })).status).toBe(404);
  });

  it("pages with a cursor, without repeats or gaps", async () => {
    const whole = (await entries()).items.map((e) => JSON.stringify(e));
    expect(whole.length).toBeGreaterThan(4);
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const page: Awaited<ReturnType<typeof entries>> = await entries(owner.token, cursor ? { limit: "2", cursor } : { limit: "2" });
      expect(page.items.length).toBeLessThanOrEqual(2);
      seen.push(...page.items.map((e) => JSON.stringify(e)));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(whole);
  });
});

describe("families: copy, edit, archive", () => {
  it("copies a built-in with its sources, names the figure and range it refuses, and records each change", async () => {
    const key = `bench-hc-${tag()}`;
    const made = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key, name: "Bench high-speed CMOS", copyOf: hcId } });
    expect(made.status).toBe(201);
    // the copy keeps the JESD7A figures and their sources (builtin.ts)
    expect(made.json.family.data).toMatchObject({ vihMin: 3.15, supplyV: 4.5, builtIn: false });
    expect(made.json.family.data.sources.vihMin).toMatch(/JESD7A/);
    const id = made.json.family.id;
    const bad = await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: id }, body: { data: { ...made.json.family.data, supplyV: 45 } } });
    expect(bad.status).toBe(400);
    expect(bad.json.error.details).toContainEqual({ path: "data.supplyV", message: "VCC (supply voltage) must be above 0 and at most 30 V; got 45" });
    const data = { ...made.json.family.data, vohMin: 4.2, sources: { ...made.json.family.data.sources, vohMin: "measured on the bench at 4 mA" } };
    const ok = await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: id }, body: { data } });
    expect(ok.status).toBe(200);
    expect(ok.json.family.data.sources.vohMin).toBe("measured on the bench at 4 mA");
    const list = (await entries()).items.filter((e) => e.subject.kind === "family" && e.subject.label === "Bench high-speed CMOS");
    expect(list.map((e) => e.action)).toEqual(["family.update", "family.create"]);
    expect(list[0]!.details.changed).toEqual(["VOH(min)", "sources"]);
    expect(list[1]!.summary).toBe("added the family “Bench high-speed CMOS”, copied from “High-speed CMOS, 5 V”");
    // a built-in's key is not free for a workspace family
    const clash = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key: "ttl-std-5v", name: "Mine", copyOf: hcId } });
    expect(clash.status).toBe(409);
  });

  it("an archived family is not offered for new designs; designs and revisions on it keep working and stay readable", async () => {
    const made = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key: `old-${tag()}`, name: `Old board ${tag()}`, copyOf: hcId } });
    const famId = made.json.family.id;
    const d = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name: `Weir gate ${tag()}`, familyId: famId, draftSource: SOURCE } });
    expect(d.status).toBe(201);
    const designId = d.json.design.id;
    const r1 = await call(revisions.POST, "POST", "/r", { token: owner.token, params: { ...p(), designId }, body: { message: "on the old board", source: SOURCE, familyId: famId, settings: {} } });
    expect(r1.status).toBe(201);

    const arch = await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: famId }, body: { archived: true } });
    expect(arch.status).toBe(200);
    expect(arch.json.family.archivedAt).not.toBeNull();
    // a change of the archived family's figures does not reach the saved revision: it reads from its snapshot
    await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: famId }, body: { data: { ...made.json.family.data, vihMin: 3.0 } } });
    const read = await call(revision.GET, "GET", "/r", { token: viewer.token, params: { ...p(), designId, number: "1" } });
    expect(read.status).toBe(200);
    expect(read.json.revision.familySnapshot.vihMin).toBe(3.15);

    const fresh = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name: `New gate ${tag()}`, familyId: famId } });
    expect(fresh.status).toBe(400);
    expect(fresh.json.error.message).toMatch(/archived and no longer offered for new designs/);
    // the design already on it compiles and saves as before
    const r2 = await call(revisions.POST, "POST", "/r", { token: owner.token, params: { ...p(), designId }, body: { message: "still here", source: SOURCE, familyId: famId, settings: {} } });
    expect(r2.status).toBe(201);
    // moving another design onto it is refused
    const other = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name: `Other gate ${tag()}`, familyId: hcId } });
    expect((await putDraft(other.json.design.id, { familyId: famId })).status).toBe(400);
    // the design already on it keeps its draft going
    expect((await putDraft(designId, { familyId: famId, source: `${SOURCE}// kept on the archived family\n` })).status).toBe(200);
    // deleting it is refused while revisions use it, with the way out named
    const del = await call(family.DELETE, "DELETE", "/f", { token: owner.token, params: { ...p(), familyId: famId } });
    expect(del.status).toBe(409);
    expect(del.json.error.message).toMatch(/archive it instead/);

    const restore = await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: famId }, body: { archived: false } });
    expect(restore.json.family.archivedAt).toBeNull();
    const list = (await entries()).items.filter((e) => e.subject.kind === "family" && e.subject.label === made.json.family.name);
    expect(list.map((e) => e.action)).toEqual(["family.restore", "family.update", "family.archive", "family.create"]);
  });
});

describe("designs are recorded", () => {
  it("creation, renaming, a family move, archiving and saved revisions; draft text is not", async () => {
    const name = `Paddle decode ${tag()}`;
    const d = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name, familyId: hcId } });
    const designId = d.json.design.id;
    const dp = { ...p(), designId };
    expect((await putDraft(designId, { familyId: hcId, source: SOURCE })).status).toBe(200);
    await call(design.PATCH, "PATCH", "/d", { token: owner.token, params: dp, body: { name: `${name} v2` } });
    const ttl = (await builtinFamily("ttl-std-5v")).id;
    expect((await putDraft(designId, { familyId: ttl })).status).toBe(200);
    expect((await putDraft(designId, { familyId: ttl, source: `${SOURCE}// typed on\n` })).status).toBe(200);
    await call(revisions.POST, "POST", "/r", { token: owner.token, params: dp, body: { message: "first save", source: SOURCE, familyId: ttl, settings: {} } });
    await call(design.PATCH, "PATCH", "/d", { token: owner.token, params: dp, body: { archived: true } });
    const list = (await entries()).items.filter((e) => e.subject.kind === "design" && e.subject.label.startsWith(name));
    expect(list.map((e) => e.action)).toEqual(["design.archive", "design.revision", "design.family", "design.rename", "design.create"]);
    expect(list.find((e) => e.action === "design.family")!.summary).toBe(`moved the design “${name} v2” from High-speed CMOS, 5 V to Bipolar TTL, standard, 5 V`);
    expect(list.find((e) => e.action === "design.revision")!.summary).toBe(`saved revision r1 of “${name} v2”: first save`);
  });
});

describe("the compatibility matrix and the design's boundaries", () => {
  it("answers every pair of the workspace's families, its own included, and leaves archived ones out", async () => {
    const own = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key: `matrix-${tag()}`, name: "Matrix own", copyOf: hcId } });
    const gone = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key: `shelved-${tag()}`, name: "Shelved", copyOf: hcId } });
    await call(family.PATCH, "PATCH", "/f", { token: owner.token, params: { ...p(), familyId: gone.json.family.id }, body: { archived: true } });
    const r = await call(familyMatrix.GET, "GET", "/m", { token: viewer.token, params: p() });
    expect(r.status).toBe(200);
    const keys: string[] = r.json.families.map((f: { key: string }) => f.key);
    expect(keys).toContain(own.json.family.key);
    expect(keys).toContain("ttl-std-5v");
    expect(keys).not.toContain(gone.json.family.key);
    expect(r.json.pairs.length).toBe(keys.length ** 2);
    // textbook standard TTL into itself: 0.4 V and 0.4 V, ten inputs each way
    expect(r.json.pairs.find((x: { driver: string; receiver: string }) => x.driver === "ttl-std-5v" && x.receiver === "ttl-std-5v")).toMatchObject({
      nmhV: 0.4, nmlV: 0.4, fanOutHigh: 10, fanOutLow: 10, verdict: "compatible",
    });
    const withArchived = await call(familyMatrix.GET, "GET", "/m", { token: viewer.token, params: p(), query: { archived: "1" } });
    expect(withArchived.json.families.map((f: { key: string }) => f.key)).toContain(gone.json.family.key);
  });

  it("a design's inputs driven by standard TTL warn on CMOS thresholds; an unknown family is refused", async () => {
    // textbook TTL VOH(min) 2.4 V < JESD7A VIH(min) 3.15 V at VCC = 4.5 V
    const c = await call(compile.POST, "POST", "/compile", {
      token: viewer.token,
      body: { source: SOURCE, workspace: ws.slug, familyId: hcId, settings: { inputsDrivenBy: "ttl-std-5v", outputsDrive: "ttl-ls-5v" } },
    });
    expect(c.status).toBe(200);
    const a = c.json.result.analysis;
    expect(a.boundaries.map((b: { side: string; verdict: string }) => [b.side, b.verdict])).toEqual([["inputs", "not-compatible"], ["outputs", "compatible"]]);
    expect(c.json.result.warnings.join(" ")).toMatch(/inputs driven by Bipolar TTL, standard, 5 V: not compatible .*3\.15 V/);
    // an own family at the boundary is found through the workspace
    const own = await call(families.POST, "POST", "/f", { token: owner.token, params: p(), body: { key: `edge-${tag()}`, name: "Edge board", copyOf: (await builtinFamily("cmos-hct-5v")).id } });
    const c2 = await call(compile.POST, "POST", "/compile", {
      token: viewer.token, body: { source: SOURCE, workspace: ws.slug, familyId: hcId, settings: { outputsDrive: own.json.family.key } },
    });
    expect(c2.json.result.analysis.boundaries[0]).toMatchObject({ side: "outputs", verdict: "compatible", receiver: { name: "Edge board" } });
    // The compile cache keys on the boundary family's figures too: the same compile is answered from the cache
    // until the receiver's figures change, then checked anew: against a VIH(min) of 4.3 V, the 4.4 V that
    // high-speed CMOS guarantees as VOH(min) at VCC = 4.5 V (JEDEC JESD7A) leaves a high noise margin of 0.1 V.
    const edgeCompile = { source: SOURCE, workspace: ws.slug, familyId: hcId, settings: { outputsDrive: own.json.family.key } };
    expect((await call(compile.POST, "POST", "/compile", { token: viewer.token, body: edgeCompile })).json.cached).toBe(true);
    const edited = await call(family.PATCH, "PATCH", "/f", {
      token: owner.token, params: { ...p(), familyId: own.json.family.id }, body: { data: { ...own.json.family.data, vihMin: 4.3 } },
    });
    expect(edited.status).toBe(200);
    const c3 = await call(compile.POST, "POST", "/compile", { token: viewer.token, body: edgeCompile });
    expect(c3.json.cached).toBe(false);
    expect(c3.json.result.analysis.boundaries[0]).toMatchObject({ side: "outputs", verdict: "small-margin" });
    const d = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name: `Edge ${tag()}`, familyId: hcId } });
    const bad = await putDraft(d.json.design.id, { familyId: hcId, settings: { inputsDrivenBy: "no-such-family" } });
    expect(bad.status).toBe(400);
    expect(bad.json.error.message).toMatch(/settings\.inputsDrivenBy names no family/);
    // a family a design names at its edges is not deleted from under it
    const edge = await call(designs.POST, "POST", "/d", { token: owner.token, params: p(), body: { name: `Edge kept ${tag()}`, familyId: hcId } });
    expect((await putDraft(edge.json.design.id, { familyId: hcId, settings: { outputsDrive: own.json.family.key } })).status).toBe(200);
    // The draft compared with a revision is compiled as the workbench compiles it, edge families included,
    // so the workbench's kept result answers it and nothing new is kept.
    const edgeP = { ...p(), designId: edge.json.design.id };
    expect((await call(revisions.POST, "POST", "/r", { token: owner.token, params: edgeP, body: { message: "first", source: SOURCE, familyId: hcId, settings: {} } })).status).toBe(201);
    const typed = `${SOURCE}// edge kept\n`;
    expect((await putDraft(edge.json.design.id, { familyId: hcId, source: typed, settings: { outputsDrive: own.json.family.key } })).status).toBe(200);
    const warm = await call(compile.POST, "POST", "/compile", {
      token: owner.token, body: { source: typed, workspace: ws.slug, familyId: hcId, settings: { outputsDrive: own.json.family.key } },
    });
    expect(warm.status).toBe(200);
    const kept = async () => Number((await db().sequelize.query<{ n: string }>("SELECT count(*) AS n FROM compile_results WHERE scope = $1", { bind: [`ws:${ws.id}`], type: QueryTypes.SELECT }))[0]!.n);
    const before = await kept();
    expect((await call(draftCompare.GET, "GET", "/c", { token: owner.token, params: edgeP, query: { from: "1" } })).status).toBe(200);
    expect(await kept()).toBe(before);
    const del = await call(family.DELETE, "DELETE", "/f", { token: owner.token, params: { ...p(), familyId: own.json.family.id } });
    expect(del.status).toBe(409);
    expect(del.json.error.message).toMatch(/A design names this family at its inputs or outputs; archive it instead/);
    expect((await putDraft(edge.json.design.id, { familyId: hcId, settings: {} })).status).toBe(200);
    expect((await call(family.DELETE, "DELETE", "/f", { token: owner.token, params: { ...p(), familyId: own.json.family.id } })).status).toBe(200);
  });
});
