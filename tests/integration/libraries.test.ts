/**
 * Shared block libraries on the real database, through the route handlers:
 * publishing (figures and verification kept, immutable revisions), use in
 * compiles and saved revisions (pinned, keeping their function when the
 * library moves on), the figure deltas of a newer revision, where-used, sharing
 * with another workspace, and the review setting with its approval seam.
 * Expected functions come from the blocks' own truth tables composed in this
 * file, not from the pipeline's answer for the design.
 */
import { spawn } from "node:child_process";
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { Sequelize } from "sequelize";
import pg from "pg";
import { db } from "@/lib/db/connection";
import { compileSource } from "@/lib/lang";
import { tableFromCubes, tableMinterms } from "@/lib/logic";
import { recordLibraryApproval } from "@/lib/data/libraries";
import * as libraries from "@/app/api/v1/workspaces/[ws]/libraries/route";
import * as library from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/route";
import * as publish from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/route";
import * as libRevision from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/[number]/route";
import * as shares from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/shares/route";
import * as share from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/shares/[workspace]/route";
import * as resolve from "@/app/api/v1/workspaces/[ws]/libraries/resolve/route";
import * as approval from "@/app/api/v1/workspaces/[ws]/libraries/[libraryId]/blocks/[block]/revisions/[number]/approval/route";
import * as compile from "@/app/api/v1/compile/route";
import * as workspace from "@/app/api/v1/workspaces/[ws]/route";
import * as designs from "@/app/api/v1/workspaces/[ws]/designs/route";
import * as revisions from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/route";
import * as revision from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/route";
import * as table from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/table/route";
import * as jobs from "@/app/api/v1/workspaces/[ws]/jobs/route";
import * as familyRoute from "@/app/api/v1/workspaces/[ws]/families/[familyId]/route";
import { addMember, builtinFamily, call, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

// Two-of-three vote of three level sensors (revision 1), and a stricter revision 2 (all three agree).
const VOTE_1 = "// two-of-three vote\ninputs a, b, c\noutputs m\nm = a * b + a * c + b * c\n";
const VOTE_2 = "// all three must agree\ninputs a, b, c\noutputs m\nm = a * b * c\n";
const DESIGN = (at: number) => [
  "// upper gate permit from voted level sensors",
  "inputs s1, s2, s3, lower_shut, estop",
  "outputs open_upper",
  `use vote2of3 from "KEY" at ${at}`,
  "open_upper = estop' * lower_shut * vote2of3(s1, s2, s3)",
  "",
].join("\n");

let owner: TestUser, designer: TestUser, viewer: TestUser, partner: TestUser, stranger: TestUser;
let ws: { id: string; slug: string };
let partnerWs: { id: string; slug: string };
let strangerWs: { id: string; slug: string };
let familyId: string;
let lib: { id: string; key: string };

const wsp = () => ({ ws: ws.slug });
const lp = (s = ws.slug) => ({ ws: s, libraryId: lib.id });
const design = (at: number, key = lib.key) => DESIGN(at).replace("KEY", key);

function ons(source: string): number[] {
  const spec = compileSource(source).spec!;
  return tableMinterms(tableFromCubes(spec.outputs[0]!.on, spec.inputs.length), spec.inputs.length);
}

/** open_upper by composing the vote block's own table with the design's wiring (inputs s1 s2 s3 lower_shut estop). */
function expectedOpen(voteSource: string): number[] {
  const vote = new Set(ons(voteSource));
  const out: number[] = [];
  for (let m = 0; m < 32; m++) {
    const bits = [4, 3, 2, 1, 0].map((k) => (m >> k) & 1);
    const [s1, s2, s3, lower, estop] = bits as [number, number, number, number, number];
    if (!estop && lower && vote.has(s1 * 4 + s2 * 2 + s3)) out.push(m);
  }
  return out;
}

async function publishVote(source: string, message: string, who = designer, s = ws.slug) {
  return call(publish.POST, "POST", "/p", { token: who.token, params: { ...lp(s), block: "vote2of3" }, body: { source, familyId, settings: {}, message } });
}

beforeAll(async () => {
  owner = await makeUser("owner");
  designer = await makeUser("designer");
  viewer = await makeUser("viewer");
  partner = await makeUser("partner");
  stranger = await makeUser("stranger");
  ws = await makeWorkspace("locks", owner);
  await addMember(ws.id, designer, "designer");
  await addMember(ws.id, viewer, "viewer");
  partnerWs = await makeWorkspace("weirs", partner);
  strangerWs = await makeWorkspace("mills", stranger);
  familyId = (await builtinFamily("cmos-hc-5v")).id;
  const r = await call(libraries.POST, "POST", "/l", { token: designer.token, params: wsp(), body: { key: `lock-blocks-${tag()}`, name: "Ferrow lock blocks" } });
  expect(r.status).toBe(201);
  lib = { id: r.json.library.id, key: r.json.library.key };
});

beforeEach(async () => {
  await resetLimits();
});

describe("publishing", () => {
  it("keeps each revision's source, ports, figures and verification, numbered per block", async () => {
    const one = await publishVote(VOTE_1, "Two-of-three vote");
    expect(one.status).toBe(201);
    expect(one.json.revision).toMatchObject({ number: 1, state: "published", inputs: ["a", "b", "c"], outputs: ["m"], block: "vote2of3" });
    // The majority of three in two-level form: ab + ac + bc, three products (textbook form of the majority function).
    expect(one.json.revision.stats).toMatchObject({ products: 3, verified: true, inputs: 3, outputs: 1 });
    const two = await publishVote(VOTE_2, "All three must agree");
    expect(two.json.revision).toMatchObject({ number: 2, state: "published" });
    const got = await call(libRevision.GET, "GET", "/r", { token: viewer.token, params: { ...lp(), block: "vote2of3", number: "1" } });
    expect(got.status).toBe(200);
    expect(got.json.revision.source).toBe(VOTE_1);
    expect(got.json.revision.verification).toMatchObject({ ok: true });
  });

  it("refuses a source that is not a publishable block, with located diagnostics, and a bad block name", async () => {
    const dc = await call(publish.POST, "POST", "/p", {
      token: designer.token, params: { ...lp(), block: "loose" },
      body: { source: "inputs a, b\noutputs f\nf = a * b dc(3)\n", familyId, message: "x" },
    });
    expect(dc.status).toBe(422);
    expect(dc.json.error.details.diagnostics[0]).toMatchObject({ line: 3, message: expect.stringContaining("never lines instead") });
    const nested = await call(publish.POST, "POST", "/p", {
      token: designer.token, params: { ...lp(), block: "nested" },
      body: { source: `inputs a, b, c\noutputs f\nuse vote2of3 from "${lib.key}" at 1\nf = vote2of3(a, b, c)\n`, familyId, message: "x" },
    });
    expect(nested.status).toBe(422);
    expect(nested.json.error.details.diagnostics[0].message).toContain("cannot use other library blocks");
    const name = await call(publish.POST, "POST", "/p", { token: designer.token, params: { ...lp(), block: "never" }, body: { source: VOTE_1, familyId, message: "x" } });
    expect(name.status).toBe(400);
    expect(name.json.error.message).toContain("reserved word");
    // Nothing was made for the refused blocks.
    const detail = await call(library.GET, "GET", "/l", { token: viewer.token, params: lp() });
    expect(detail.json.library.blocks.map((b: { name: string }) => b.name)).toEqual(["vote2of3"]);
  });

  it("library revisions are records: UPDATE and DELETE refused through Sequelize, the app role and (as owner) the triggers", async () => {
    const rev = await db().models.LibraryRevision.findOne();
    await expect(rev!.update({ message: "rewritten" })).rejects.toThrow(/immutable/);
    await expect(rev!.destroy()).rejects.toThrow(/immutable/);
    const { sequelize } = db();
    for (const t of ["library_revisions", "library_approvals", "revision_libraries"]) {
      await expect(sequelize.query(`DELETE FROM ${t}`)).rejects.toThrow(/permission denied|records/);
      await expect(sequelize.query(`TRUNCATE ${t}`)).rejects.toThrow(/permission denied|immutable/);
    }
    await expect(sequelize.query("UPDATE library_revisions SET source = 'x'")).rejects.toThrow(/permission denied|records/);
    if (process.env.DATABASE_OWNER_URL) {
      const ownerDb = new Sequelize(process.env.DATABASE_OWNER_URL, { dialect: "postgres", dialectModule: pg, logging: false });
      try {
        await expect(ownerDb.query("UPDATE library_revisions SET source = 'x'")).rejects.toThrow(/library_revisions are records: UPDATE refused/);
        await expect(ownerDb.query("DELETE FROM library_revisions")).rejects.toThrow(/records: DELETE refused/);
        await expect(ownerDb.query("TRUNCATE library_revisions CASCADE")).rejects.toThrow(/TRUNCATE refused/);
      } finally {
        await ownerDb.close();
      }
    }
    expect((await db().models.LibraryRevision.findByPk(rev!.id))!.source).toBe(rev!.source);
  });
});

describe("use in designs", () => {
  let designId: string;

  it("compiles a design that uses a block; the answer names the newer revision with the deltas of the stored figures", async () => {
    const r = await call(compile.POST, "POST", "/compile", { token: designer.token, body: { source: design(1), workspace: ws.slug, familyId } });
    expect(r.status).toBe(200);
    expect(r.json.diagnostics).toEqual([]);
    expect(r.json.result.stats.verified).toBe(true);
    const [use] = r.json.libraries;
    expect(use).toMatchObject({ library: lib.key, block: "vote2of3", revision: 1, revisionRange: { line: 4, endLine: 4 } });
    const stored = await db().models.LibraryRevision.findAll({ order: [["number", "ASC"]], include: [{ association: "block", where: { libraryId: lib.id } }] });
    const [s1, s2] = stored.map((x) => x.stats as Record<string, number>);
    expect(use.newer.number).toBe(2);
    const gates = use.newer.deltas.find((d: { figure: string }) => d.figure === "gates");
    expect(gates).toEqual({ figure: "gates", label: "gates", unit: "", from: s1!.gates, to: s2!.gates, delta: s2!.gates! - s1!.gates! });
    expect(use.newer.portChange).toBeNull();
  });

  it("a saved revision pins the block revision, and keeps its function after the library publishes a new one", async () => {
    const d = await call(designs.POST, "POST", "/d", { token: designer.token, params: wsp(), body: { name: `Upper gate ${tag()}`, familyId, draftSource: design(1) } });
    designId = d.json.design.id;
    const saved = await call(revisions.POST, "POST", "/r", { token: designer.token, params: { ...wsp(), designId }, body: { message: "voted sensors", source: design(1), familyId, settings: {} } });
    expect(saved.status).toBe(201);
    expect(saved.json.revision.libraries).toEqual([{ library: lib.key, block: "vote2of3", revision: 1 }]);

    const before = await call(table.GET, "GET", "/t", { token: viewer.token, params: { ...wsp(), designId, number: "1" }, query: { format: "json", limit: "32" } });
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const onOf = (page: any): number[] => (page.rows as Array<{ minterm: number; cells: string[] }>).filter((row) => row.cells.at(-1) === "1").map((row) => row.minterm);
    expect(onOf(before.json)).toEqual(expectedOpen(VOTE_1));

    const three = await publishVote("// wider wording, same as revision 2\ninputs a, b, c\noutputs m\nm = (a * b) * c\n", "Reworded");
    expect(three.json.revision.number).toBe(3);
    const after = await call(table.GET, "GET", "/t", { token: viewer.token, params: { ...wsp(), designId, number: "1" }, query: { format: "json", limit: "32" } });
    expect(onOf(after.json)).toEqual(expectedOpen(VOTE_1));
    const detail = await call(revision.GET, "GET", "/r", { token: viewer.token, params: { ...wsp(), designId, number: "1" } });
    expect(detail.json.revision.libraries).toEqual([{ library: lib.key, block: "vote2of3", revision: 1 }]);

    // Saved again at revision 2: its own pin, the stricter function.
    const moved = await call(revisions.POST, "POST", "/r", { token: designer.token, params: { ...wsp(), designId }, body: { message: "move to r2", source: design(2), familyId, settings: {} } });
    expect(moved.json.revision.libraries).toEqual([{ library: lib.key, block: "vote2of3", revision: 2 }]);
    const t2 = await call(table.GET, "GET", "/t", { token: viewer.token, params: { ...wsp(), designId, number: "2" }, query: { format: "json", limit: "32" } });
    expect(onOf(t2.json)).toEqual(expectedOpen(VOTE_2));
    expect(expectedOpen(VOTE_2)).not.toEqual(expectedOpen(VOTE_1));
  });

  it("the library page lists which designs and revisions use each block revision", async () => {
    const r = await call(library.GET, "GET", "/l", { token: viewer.token, params: lp() });
    const [block] = r.json.library.blocks;
    expect(block.latest).toBe(3);
    const used = Object.fromEntries(block.revisions.map((x: { number: number; usedBy: Array<{ revisions: number[] }> }) => [x.number, x.usedBy.map((u) => u.revisions)]));
    expect(used).toEqual({ 1: [[1]], 2: [[2]], 3: [] });
    // Revision 3 against revision 2: the deltas of the stored figures.
    expect(block.revisions[2].deltas.find((x: { figure: string }) => x.figure === "gates").delta).toBe(block.revisions[2].stats.gates - block.revisions[1].stats.gates);
  });

  it("use lines that cannot be resolved are located errors that say what to write", async () => {
    const cases: Array<[string, RegExp]> = [
      [design(9), /has no revision 9; its revisions are 1, 2, 3 \(write at 3 for the latest\)/],
      [design(1).replace("vote2of3 from", "vote3 from").replace("vote2of3(", "vote3("), /has no block 'vote3'; its blocks are vote2of3/],
      [design(1, "no-such-lib"), /there is no library "no-such-lib" this workspace can use; the libraries this workspace can use are /],
      [design(1).replace(" at 1", ""), /write use vote2of3 from ".*" at 3 \(the latest\)/],
    ];
    for (const [source, message] of cases) {
      const r = await call(compile.POST, "POST", "/compile", { token: designer.token, body: { source, workspace: ws.slug, familyId } });
      expect(r.status).toBe(200);
      expect(r.json.result).toBeNull();
      expect(r.json.diagnostics[0]).toMatchObject({ severity: "error", line: 4, column: 1, message: expect.stringMatching(message) });
    }
    // Outside a workspace there is no library to use.
    const bare = await call(compile.POST, "POST", "/compile", { token: designer.token, body: { source: design(1), familyKey: "cmos-hc-5v" } });
    expect(bare.json.diagnostics[0].message).toContain("library blocks are used within a workspace");
  });

  it("resolve answers the use lines for clients that compile on their own, as the server's compiles would", async () => {
    const r = await call(resolve.POST, "POST", "/r", {
      token: viewer.token, params: wsp(),
      body: { uses: [{ library: lib.key, block: "vote2of3", revision: 1 }, { library: lib.key, block: "nope", revision: 1 }] },
    });
    expect(r.status).toBe(200);
    expect(r.json.items[0]).toMatchObject({ ok: true, number: 1, latest: 3, source: VOTE_1, inputs: ["a", "b", "c"], outputs: ["m"] });
    expect(r.json.items[1]).toMatchObject({ ok: false, message: expect.stringContaining("has no block 'nope'") });
  });

  it("a background job resolves use lines too", async () => {
    const r = await call(jobs.POST, "POST", "/j", { token: designer.token, params: wsp(), body: { source: design(1), familyId, settings: {} } });
    expect(r.status).toBe(202);
  });
});

describe("access", () => {
  it("viewers read but do not publish; another workspace finds nothing", async () => {
    expect((await publishVote(VOTE_1, "x", viewer)).status).toBe(403);
    expect((await call(libraries.POST, "POST", "/l", { token: viewer.token, params: wsp(), body: { key: "mine", name: "Mine" } })).status).toBe(403);
    // The stranger through their own workspace: this library is not there.
    expect((await call(library.GET, "GET", "/l", { token: stranger.token, params: lp(strangerWs.slug) })).status).toBe(404);
    expect((await publishVote(VOTE_1, "x", stranger, strangerWs.slug)).status).toBe(404);
    const c = await call(compile.POST, "POST", "/compile", { token: stranger.token, body: { source: design(1, `${ws.slug}/${lib.key}`), workspace: strangerWs.slug, familyId } });
    expect(c.json.diagnostics[0].message).toMatch(/there is no library ".*" this workspace can use/);
    const listed = await call(libraries.GET, "GET", "/l", { token: stranger.token, params: { ws: strangerWs.slug } });
    expect(listed.json.items).toEqual([]);
  });

  it("an owner shares a library read-only: the other workspace uses it by slug/key and cannot publish; ending the share keeps saved revisions", async () => {
    expect((await call(shares.POST, "POST", "/s", { token: designer.token, params: lp(), body: { workspace: partnerWs.slug } })).status).toBe(403);
    const s = await call(shares.POST, "POST", "/s", { token: owner.token, params: lp(), body: { workspace: partnerWs.slug } });
    expect(s.status).toBe(201);
    expect(s.json.library.shares.map((x: { workspace: { slug: string } }) => x.workspace.slug)).toEqual([partnerWs.slug]);
    expect((await call(shares.POST, "POST", "/s", { token: owner.token, params: lp(), body: { workspace: partnerWs.slug } })).status).toBe(409);

    const listed = await call(libraries.GET, "GET", "/l", { token: partner.token, params: { ws: partnerWs.slug } });
    expect(listed.json.items).toHaveLength(1);
    expect(listed.json.items[0]).toMatchObject({ ref: `${ws.slug}/${lib.key}`, sharedIn: true, mayPublish: false, owner: { slug: ws.slug } });
    const seen = await call(library.GET, "GET", "/l", { token: partner.token, params: lp(partnerWs.slug) });
    expect(seen.status).toBe(200);
    expect(seen.json.library.shares).toBeNull();
    // Where-used shows the reader's own workspace only.
    expect(seen.json.library.blocks[0].revisions[0].usedBy).toEqual([]);
    // Published by the owner of the other workspace: refused, read-only.
    const refused = await publishVote(VOTE_1, "x", partner, partnerWs.slug);
    expect(refused.status).toBe(403);
    expect(refused.json.error.message).toContain(`belongs to the workspace ${ws.slug}`);
    expect((await call(shares.POST, "POST", "/s", { token: partner.token, params: lp(partnerWs.slug), body: { workspace: strangerWs.slug } })).status).toBe(403);

    // Bare key: not this workspace's, with the spelling that works.
    const bare = await call(compile.POST, "POST", "/compile", { token: partner.token, body: { source: design(1), workspace: partnerWs.slug, familyId } });
    expect(bare.json.diagnostics[0].message).toContain(`is written "${ws.slug}/${lib.key}"`);
    const src = design(1, `${ws.slug}/${lib.key}`);
    const c = await call(compile.POST, "POST", "/compile", { token: partner.token, body: { source: src, workspace: partnerWs.slug, familyId } });
    expect(c.json.diagnostics).toEqual([]);
    const d = await call(designs.POST, "POST", "/d", { token: partner.token, params: { ws: partnerWs.slug }, body: { name: `Weir gate ${tag()}`, familyId } });
    const pd = { ws: partnerWs.slug, designId: d.json.design.id };
    const saved = await call(revisions.POST, "POST", "/r", { token: partner.token, params: pd, body: { message: "shared vote", source: src, familyId, settings: {} } });
    expect(saved.status).toBe(201);

    const un = await call(share.DELETE, "DELETE", "/s", { token: owner.token, params: { ...lp(), workspace: partnerWs.slug } });
    expect(un.status).toBe(200);
    expect((await call(library.GET, "GET", "/l", { token: partner.token, params: lp(partnerWs.slug) })).status).toBe(404);
    const gone = await call(compile.POST, "POST", "/compile", { token: partner.token, body: { source: src, workspace: partnerWs.slug, familyId } });
    expect(gone.json.diagnostics[0].message).toMatch(/there is no library/);
    // The saved revision keeps what it pinned.
    const t = await call(table.GET, "GET", "/t", { token: partner.token, params: { ...pd, number: "1" }, query: { format: "json", limit: "32" } });
    expect(t.status).toBe(200);
    expect(t.json.rows.filter((r: { cells: string[] }) => r.cells.at(-1) === "1").map((r: { minterm: number }) => r.minterm)).toEqual(expectedOpen(VOTE_1));
  });
});

describe("the family a block revision was published under", () => {
  it("cannot be deleted while a library revision keeps its figures under it (409: archive it instead)", async () => {
    const hc = await builtinFamily();
    const own = await db().models.LogicFamilyRecord.create({ workspaceId: ws.id, key: `board-${tag()}`, name: `Board family ${tag()}`, builtin: false, data: { ...hc.data } });
    const lib2 = await call(libraries.POST, "POST", "/l", { token: designer.token, params: wsp(), body: { key: `fam-${tag()}`, name: "Family check" } });
    const published = await call(publish.POST, "POST", "/p", {
      token: designer.token, params: { ...wsp(), libraryId: lib2.json.library.id, block: "vote" }, body: { source: VOTE_1, familyId: own.id, settings: {}, message: "under the board family" },
    });
    expect(published.status).toBe(201);
    const del = await call(familyRoute.DELETE, "DELETE", "/f", { token: owner.token, params: { ...wsp(), familyId: own.id } });
    expect(del.status).toBe(409);
    expect(del.json.error.message).toMatch(/library block revisions use this family; archive it instead/);
  });
});

describe("an approved review before a publish counts", () => {
  it("under requireReviewToPublish a revision awaits review, cannot be used, and counts once approved", async () => {
    const set = await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: wsp(), body: { settings: { requireReviewToPublish: true } } });
    expect(set.status).toBe(200);
    const four = await publishVote(VOTE_1, "Back to two of three");
    expect(four.status).toBe(201);
    expect(four.json.revision).toMatchObject({ number: 4, state: "awaiting review" });
    const detail = await call(library.GET, "GET", "/l", { token: viewer.token, params: lp() });
    expect(detail.json.library.requireReview).toBe(true);
    expect(detail.json.library.blocks[0].latest).toBe(3);
    const c = await call(compile.POST, "POST", "/compile", { token: designer.token, body: { source: design(4), workspace: ws.slug, familyId } });
    expect(c.json.diagnostics[0].message).toMatch(/revision 4 of 'vote2of3' .* awaits an approved review and may not be used yet; write at 3/);

    const rev = await db().models.LibraryRevision.findByPk(four.json.revision.id);
    await expect(recordLibraryApproval({ libraryRevisionId: rev!.id, reviewId: null, approvedBy: designer.id })).rejects.toThrow(/you published/);
    await recordLibraryApproval({ libraryRevisionId: rev!.id, reviewId: null, approvedBy: owner.id, note: "checked against the sensor drawings" });
    await expect(recordLibraryApproval({ libraryRevisionId: rev!.id, reviewId: null, approvedBy: owner.id })).rejects.toThrow(/approved already/);
    const now = await call(library.GET, "GET", "/l", { token: viewer.token, params: lp() });
    expect(now.json.library.blocks[0].latest).toBe(4);
    expect(now.json.library.blocks[0].revisions[3].state).toBe("published");
    const ok = await call(compile.POST, "POST", "/compile", { token: designer.token, body: { source: design(4), workspace: ws.slug, familyId } });
    expect(ok.json.diagnostics).toEqual([]);
    await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: wsp(), body: { settings: { requireReviewToPublish: false } } });
  });

  it("approving through the route: those who may approve, never the author, once", async () => {
    await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: wsp(), body: { settings: { requireReviewToPublish: true } } });
    const byDesigner = await publishVote(VOTE_2, "All three again");
    expect(byDesigner.json.revision.state).toBe("awaiting review");
    const n = byDesigner.json.revision.number as number;
    const approve = (who: TestUser, number: number, note?: string) =>
      call(approval.POST, "POST", "/a", { token: who.token, params: { ...lp(), block: "vote2of3", number: String(number) }, body: note ? { note } : {} });
    expect((await approve(viewer, n)).status).toBe(403);
    expect((await approve(designer, n)).status).toBe(403);
    const ok = await approve(owner, n, "read against the sensor wiring");
    expect(ok.status).toBe(201);
    expect(ok.json.revision).toMatchObject({ number: n, state: "published" });
    expect((await approve(owner, n)).status).toBe(409);
    const latest = await call(library.GET, "GET", "/l", { token: viewer.token, params: lp() });
    expect(latest.json.library.blocks[0].latest).toBe(n);
    // The owner's own revision waits for someone else.
    const byOwner = await publishVote(VOTE_1, "Two of three again", owner);
    const own = await approve(owner, byOwner.json.revision.number as number);
    expect(own.status).toBe(403);
    expect(own.json.error.message).toMatch(/you published/);
    // A revision that needed no review is refused.
    await call(workspace.PATCH, "PATCH", "/w", { token: owner.token, params: wsp(), body: { settings: { requireReviewToPublish: false } } });
    expect((await approve(owner, 1)).status).toBe(409);
  });
});

describe("the CLI against the server's API (FANBOUND_URL, FANBOUND_TOKEN)", () => {
  it("resolves use lines through the resolve route, as the workspace's compiles would", async () => {
    // The real route handler behind a plain HTTP listener on loopback, so the CLI speaks HTTP to it as to the app.
    const server = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on("data", (c: Buffer) => chunks.push(c));
      req.on("end", () => {
        const url = new URL(req.url ?? "/", "http://127.0.0.1");
        const m = /^\/api\/v1\/workspaces\/([^/]+)\/libraries\/resolve$/.exec(url.pathname);
        if (!m || req.method !== "POST") {
          res.writeHead(404).end();
          return;
        }
        const headers = new Headers();
        for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
        void resolve.POST(new Request(url, { method: "POST", headers, body: Buffer.concat(chunks) }), { params: Promise.resolve({ ws: decodeURIComponent(m[1]!) }) })
          .then(async (r) => {
            res.writeHead(r.status, { "content-type": "application/json" }).end(await r.text());
          });
      });
    });
    await new Promise<void>((ok) => server.listen(0, "127.0.0.1", ok));
    const port = (server.address() as AddressInfo).port;
    try {
      const run = (source: string, env: Record<string, string>) =>
        new Promise<{ code: number | null; out: string }>((ok) => {
          const child = spawn(process.execPath, ["lib/cli/run.mjs", "table", "-"], { env: { ...process.env, FANBOUND_URL: `http://127.0.0.1:${port}`, FANBOUND_TOKEN: designer.token, ...env } });
          let out = "";
          child.stdout.on("data", (c: Buffer) => (out += c.toString()));
          child.on("close", (code) => ok({ code, out }));
          child.stdin.end(source);
        });
      const pinned = await run(design(2), { FANBOUND_WORKSPACE: ws.slug });
      expect(pinned.code).toBe(0);
      expect(JSON.parse(pinned.out).outputs[0].on).toEqual(expectedOpen(VOTE_2));
      // Without FANBOUND_WORKSPACE, a "slug/key" line names the workspace itself.
      const bySlug = await run(design(1, `${ws.slug}/${lib.key}`), { FANBOUND_WORKSPACE: "" });
      expect(JSON.parse(bySlug.out).outputs[0].on).toEqual(expectedOpen(VOTE_1));
      // A caller the server does not know is told what the server said.
      const unknown = await run(design(1, `${ws.slug}/${lib.key}`), { FANBOUND_WORKSPACE: "", FANBOUND_TOKEN: "not-a-token" });
      expect(unknown.code).toBe(1);
      expect(JSON.parse(unknown.out).diagnostics[0].message).toMatch(/could not answer for workspace .*: Sign in, or send a personal API token/);
    } finally {
      server.close();
    }
  });
});
