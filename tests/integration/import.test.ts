/**
 * Import routes on the real database: a design made from a truth table or a
 * Verilog module, refusals that create nothing, and the revision's truth
 * table going back out. The functions are checked by brute force from the
 * specification (tests/import/helpers.ts).
 */
import { readFileSync } from "node:fs";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/lib/db/connection";
import { resetLimits } from "@/lib/api/rate-limit";
import { createRevision } from "@/lib/data/revisions";
import { importTruthTable } from "@/lib/import";
import * as importDesign from "@/app/api/v1/workspaces/[ws]/designs/import/route";
import * as importPreview from "@/app/api/v1/import/route";
import * as table from "@/app/api/v1/workspaces/[ws]/designs/[designId]/revisions/[number]/table/route";
import { addMember, builtinFamily, call, counts, makeUser, makeWorkspace, tag, type TestUser } from "./helpers";
import { bruteTable, specOf } from "../import/helpers";

let owner: TestUser;
let reviewer: TestUser;
let ws: { id: string; slug: string };
let familyId: string;
const sluice = readFileSync("lib/import/examples/sluice-alarm.csv", "utf8");
const horn = readFileSync("lib/import/examples/weir-horn.v", "utf8");

beforeAll(async () => {
  owner = await makeUser("owner");
  reviewer = await makeUser("reviewer");
  ws = await makeWorkspace("import", owner);
  await addMember(ws.id, reviewer, "reviewer");
  familyId = (await builtinFamily()).id;
});

beforeEach(async () => {
  await resetLimits();
});

const post = (token: string, body: Record<string, unknown>) =>
  call(importDesign.POST, "POST", `/workspaces/${ws.slug}/designs/import`, { token, params: { ws: ws.slug }, body });

describe("POST /workspaces/{ws}/designs/import", () => {
  it("creates a design whose draft is the imported truth table", async () => {
    const r = await post(owner.token, { kind: "csv", text: sluice, outputs: ["alarm", "horn"], fileName: "sluice-alarm.csv", name: `Sluice alarm ${tag()}`, familyId });
    expect(r.status).toBe(201);
    const expected = importTruthTable(sluice, { outputs: ["alarm", "horn"], name: "sluice-alarm.csv" }).source!;
    expect(r.json.design.draftSource).toBe(expected);
    expect(r.json.design.latestRevision).toBeNull();
    const row = await db().models.Design.findByPk(r.json.design.id);
    expect(row!.draftSource).toBe(expected);
  });

  it("creates a design from a Verilog module, inputs in port order", async () => {
    const r = await post(owner.token, { kind: "verilog", text: horn, fileName: "weir-horn.v", name: `Weir horn ${tag()}`, familyId });
    expect(r.status).toBe(201);
    expect(specOf(r.json.design.draftSource).inputs).toEqual(["sluice_open", "pound_high", "flow", "override_key"]);
  });

  it("refuses a contradictory table with 422 and the located diagnostics, creating nothing", async () => {
    const before = await counts();
    const r = await post(owner.token, { kind: "csv", text: "a,b,y\n0,1,1\n-,1,0\n", name: `Bad ${tag()}`, familyId });
    expect(r.status).toBe(422);
    expect(r.json.error.code).toBe("import_refused");
    expect(r.json.error.message).toContain("rows 2 and 3 contradict each other");
    expect(r.json.error.details.diagnostics[0]).toMatchObject({ severity: "error", row: 3, col: 3, colName: "y", line: 3 });
    expect(await counts()).toEqual(before);
  });

  it("refuses a Verilog construct outside the subset with its line and column", async () => {
    const r = await post(owner.token, { kind: "verilog", text: "module m(input a, output y);\nalways @(a) y = a;\nendmodule\n", name: `Bad ${tag()}`, familyId });
    expect(r.status).toBe(422);
    expect(r.json.error.details.diagnostics[0]).toMatchObject({ line: 2, column: 1 });
    expect(r.json.error.details.diagnostics[0].message).toMatch(/^always blocks are outside the imported subset/);
  });

  it("forbids reviewers (403) and refuses outputs for Verilog (400)", async () => {
    const r = await post(reviewer.token, { kind: "csv", text: sluice, name: `No ${tag()}`, familyId });
    expect(r.status).toBe(403);
    const v = await post(owner.token, { kind: "verilog", text: horn, outputs: ["horn"], name: `No ${tag()}`, familyId });
    expect(v.status).toBe(400);
  });

  it("takes tables larger than the ordinary 256 KiB body limit", async () => {
    // 12 inputs, full table: 4096 rows of 26 characters, about 106 KB; JSON
    // escaping of tabs and line breaks brings the body past 256 KiB with padding rows.
    const names = Array.from({ length: 12 }, (_, i) => `x${i}`);
    const rows = [[...names, "y"].join("\t")];
    for (let m = 0; m < 4096; m++) rows.push([...Array.from({ length: 12 }, (_, i) => (m >> (11 - i)) & 1), m % 3 === 0 ? 1 : 0].join("\t"));
    const text = rows.join("\n") + "\n".repeat(120_000);
    expect(JSON.stringify(text).length).toBeGreaterThan(256 * 1024);
    const r = await post(owner.token, { kind: "csv", text, name: `Wide ${tag()}`, familyId });
    expect(r.status).toBe(201);
    const t = bruteTable(specOf(r.json.design.draftSource))[0]!;
    expect(t.every((v, m) => v === (m % 3 === 0 ? "1" : "0"))).toBe(true);
  });
});

describe("POST /import (preview)", () => {
  it("answers the source, or the diagnostics with no source", async () => {
    const ok = await call(importPreview.POST, "POST", "/import", { token: reviewer.token, body: { kind: "verilog", text: horn } });
    expect(ok.status).toBe(200);
    expect(ok.json.source).toContain("horn = (blocked + rising * flow') * override_key'");
    const bad = await call(importPreview.POST, "POST", "/import", { token: reviewer.token, body: { kind: "csv", text: "a,b,y\n0,1,1\n0,1,q\n" } });
    expect(bad.status).toBe(200);
    expect(bad.json.source).toBeNull();
    expect(bad.json.diagnostics).toHaveLength(1);
    expect(bad.json.diagnostics[0]).toMatchObject({ row: 3, col: 3, colName: "y" });
  });
});

describe("GET .../revisions/{n}/table", () => {
  let designId: string;
  const source = "inputs a, b, c\noutputs f, g\nf = a * b' + c\ng = on(1, 3) dc(6, 7)\n";
  beforeAll(async () => {
    const d = await db().models.Design.create({ workspaceId: ws.id, name: `Lamp ${tag()}`, description: "", familyId, settings: {}, draftSource: source, createdBy: owner.id, archivedAt: null });
    designId = d.id;
    await createRevision({ actor: { userId: owner.id, via: "token" }, slug: ws.slug, designId, message: "first", source, familyId, settings: {} });
  });

  it("downloads the CSV, which imports back to the same function", async () => {
    const r = await call(table.GET, "GET", "/t", { token: reviewer.token, params: { ws: ws.slug, designId, number: "1" }, query: { format: "csv" } });
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(r.headers.get("content-disposition")).toMatch(/-r1-table\.csv"$/);
    const back = importTruthTable(r.text, { outputs: ["f", "g"] });
    expect(bruteTable(specOf(back.source!))).toEqual(bruteTable(specOf(source)));
  });

  it("pages the rows as JSON", async () => {
    const r = await call(table.GET, "GET", "/t", { token: reviewer.token, params: { ws: ws.slug, designId, number: "1" }, query: { format: "json", offset: "4", limit: "3" } });
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ inputs: ["a", "b", "c"], outputs: ["f", "g"], rowCount: 8, offset: 4, limit: 3 });
    // by hand: 4 = a, not b, not c: f = 1, g = 0; 5 = a, not b, c: f = 1, g = 0; 6 = a, b, not c: f = 0, g open
    expect(r.json.rows).toEqual([
      { minterm: 4, cells: ["1", "0", "0", "1", "0"] },
      { minterm: 5, cells: ["1", "0", "1", "1", "0"] },
      { minterm: 6, cells: ["1", "1", "0", "0", "-"] },
    ]);
  });
});
