/**
 * The design's draft on the server: each write names the version it started
 * from, a write based on an older version is refused with the draft as it now
 * is, a repeat of a write that landed is not a conflict, and a revision save
 * moves the draft on only when the draft is still where the saver's text came
 * from. Optimistic concurrency control by version number — common practice,
 * no source (compare HTTP's If-Match, RFC 9110 §13.1.1).
 */
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/lib/db/connection";
import * as designs from "@/app/api/v1/workspaces/[ws]/designs/route";
import * as design from "@/app/api/v1/workspaces/[ws]/designs/[designId]/route";
import * as draft from "@/app/api/v1/workspaces/[ws]/designs/[designId]/draft/route";
import * as revisions from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/route";
import { SOURCE, addMember, builtinFamily, call, makeUser, makeWorkspace, resetLimits, tag, type TestUser } from "./helpers";

let owner: TestUser;
let designer: TestUser;
let ws: { id: string; slug: string };
let familyId: string;

beforeAll(async () => {
  owner = await makeUser("owner");
  designer = await makeUser("designer");
  ws = await makeWorkspace("drafts", owner);
  await addMember(ws.id, designer, "designer");
  familyId = (await builtinFamily()).id;
});

beforeEach(async () => {
  await resetLimits();
});

async function newDesign() {
  const r = await call(designs.POST, "POST", "/d", { token: designer.token, params: { ws: ws.slug }, body: { name: `Sluice ${tag()}`, familyId, draftSource: "" } });
  expect(r.status).toBe(201);
  return r.json.design as { id: string; draftVersion: number };
}

const put = (who: TestUser, designId: string, source: string, baseVersion: number, settings: Record<string, unknown> = {}) =>
  call(draft.PUT, "PUT", "/d", { token: who.token, params: { ws: ws.slug, designId }, body: { source, familyId, settings, baseVersion } });

describe("the draft's version", () => {
  it("bumps with each write and names who wrote last", async () => {
    const d = await newDesign();
    expect(d.draftVersion).toBe(1);
    const r = await put(designer, d.id, SOURCE, 1);
    expect(r.status).toBe(200);
    expect(r.json.design).toMatchObject({ draftSource: SOURCE, draftVersion: 2, draftUpdatedBy: { id: designer.id } });
    const g = await call(design.GET, "GET", "/d", { token: owner.token, params: { ws: ws.slug, designId: d.id } });
    expect(g.json.design.draftVersion).toBe(2);
    expect(g.json.design.draftSource).toBe(SOURCE);
  });

  it("refuses a write based on an older version with 409 and the current draft, writing nothing", async () => {
    const d = await newDesign();
    expect((await put(designer, d.id, "// tab one\n", 1)).status).toBe(200);
    const second = await put(owner, d.id, "// tab two\n", 1);
    expect(second.status).toBe(409);
    expect(second.json.error.code).toBe("conflict");
    expect(second.json.error.message).toContain(designer.name);
    expect(second.json.error.details.draft).toMatchObject({ source: "// tab one\n", version: 2, familyId, updatedBy: { id: designer.id } });
    const row = await db().models.Design.findByPk(d.id);
    expect(row!.draftSource).toBe("// tab one\n");
    expect(row!.draftVersion).toBe(2);
  });

  it("takes a repeat of a write that already landed without a conflict", async () => {
    const d = await newDesign();
    expect((await put(designer, d.id, SOURCE, 1)).status).toBe(200);
    const again = await put(designer, d.id, SOURCE, 1);
    expect(again.status).toBe(200);
    expect(again.json.design.draftVersion).toBe(2);
  });

  it("lets the writer keep their text by writing on top of the version the conflict reported", async () => {
    const d = await newDesign();
    await put(owner, d.id, "// theirs\n", 1);
    const refused = await put(designer, d.id, "// mine\n", 1);
    expect(refused.status).toBe(409);
    const kept = await put(designer, d.id, "// mine\n", refused.json.error.details.draft.version);
    expect(kept.status).toBe(200);
    expect(kept.json.design).toMatchObject({ draftSource: "// mine\n", draftVersion: 3 });
  });

  it("refuses settings the pipeline cannot take without touching the draft", async () => {
    const d = await newDesign();
    const r = await put(designer, d.id, SOURCE, 1, { fanIn: 1 });
    expect(r.status).toBe(400);
    expect(r.json.error.message).toMatch(/fan-in/);
    const row = await db().models.Design.findByPk(d.id);
    expect(row!.draftVersion).toBe(1);
    expect(row!.draftSource).toBe("");
  });

  it("no longer takes draft fields through PATCH (they would skip the version check)", async () => {
    const d = await newDesign();
    const r = await call(design.PATCH, "PATCH", "/d", { token: designer.token, params: { ws: ws.slug, designId: d.id }, body: { draftSource: "// sneaked\n" } });
    expect(r.status).toBe(400);
    expect((await db().models.Design.findByPk(d.id))!.draftSource).toBe("");
  });
});

describe("a revision save and the draft", () => {
  it("moves the draft to the saved source when the draft is still at the saver's version", async () => {
    const d = await newDesign();
    await put(designer, d.id, SOURCE, 1);
    const r = await call(revisions.POST, "POST", "/r", {
      token: designer.token, params: { ws: ws.slug, designId: d.id },
      body: { message: "first", source: `${SOURCE}// saved\n`, familyId, settings: {}, draftVersion: 2 },
    });
    expect(r.status).toBe(201);
    const row = await db().models.Design.findByPk(d.id);
    expect(row!.draftSource).toBe(`${SOURCE}// saved\n`);
    expect(row!.draftVersion).toBe(3);
  });

  it("leaves a draft someone changed meanwhile alone, and still saves the revision", async () => {
    const d = await newDesign();
    await put(designer, d.id, SOURCE, 1);
    await put(owner, d.id, `${SOURCE}// the owner's edit\n`, 2);
    const r = await call(revisions.POST, "POST", "/r", {
      token: designer.token, params: { ws: ws.slug, designId: d.id },
      body: { message: "from the older text", source: SOURCE, familyId, settings: {}, draftVersion: 2 },
    });
    expect(r.status).toBe(201);
    expect(r.json.revision.source).toBe(SOURCE);
    const row = await db().models.Design.findByPk(d.id);
    expect(row!.draftSource).toBe(`${SOURCE}// the owner's edit\n`);
    expect(row!.draftVersion).toBe(3);
  });
});
