/**
 * The demo designs of Ferrow Lock & Weir, each with revisions that tell how it
 * grew: an added impossible combination, a family change, a fan-in fix, a
 * factored netlist kept instead of the two-level one. Every
 * figure stored comes from running the real pipeline on that revision.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { Op } from "sequelize";
import type { initModels } from "../../models";
import type { Family } from "../families";
import { compileNow, type DesignSettings } from "../pipeline";
import { importDesign, type ImportKind } from "../import";

type Models = ReturnType<typeof initModels>;
type Settings = DesignSettings;

interface Step {
  message: string;
  author: "designer" | "owner";
  family: string;
  settings?: Settings;
  /** Source of this revision, from the example file's text. */
  edit?: (full: string) => string;
}

interface DemoDesign {
  name: string;
  description: string;
  /** An example source in lib/lang/examples, or a file brought in through the import (lib/import/examples). */
  file: string;
  imported?: { kind: ImportKind; outputs?: string[] };
  steps: Step[];
}

// The seed runs from the project's root (npm start, npm test), as a bundle in .build/.
const examples = path.join(process.cwd(), "lib/lang/examples");
const importExamples = path.join(process.cwd(), "lib/import/examples");

/** The design source the import makes of an example file; the seed stops if it is refused. */
function importedSource(demo: DemoDesign): string {
  const r = importDesign(demo.imported!.kind, readFileSync(path.join(importExamples, demo.file), "utf8"), { outputs: demo.imported!.outputs, name: demo.file });
  if (r.source === null) throw new Error(`demo design "${demo.name}": ${demo.file} was refused: ${JSON.stringify(r.diagnostics)}`);
  return r.source;
}
/** The example without its impossible-combination lines: how a first draft reads. */
const withoutNever = (s: string) => s.split("\n").filter((l) => !/^\s*never\b/.test(l)).join("\n");

export const DEMO_DESIGNS: DemoDesign[] = [
  {
    name: "Chamber interlock",
    description: "Gate-open permits, paddle enables and the alarm for one lock chamber",
    file: "chamber-interlock.fnb",
    steps: [
      { message: "First cut of the gate permits, paddles and alarm", author: "designer", family: "ttl-std-5v", edit: withoutNever },
      { message: "The chamber cannot be level with both pounds: add it as impossible", author: "designer", family: "ttl-std-5v" },
      { message: "New controller board uses high-speed CMOS", author: "designer", family: "cmos-hc-5v" },
      { message: "Fit the spare two-input NANDs on the board: NAND–NAND, fan-in 2", author: "designer", family: "cmos-hc-5v", settings: { form: "nand", fanIn: 2 } },
      { message: "Four-input NANDs after all; the inverters take the spare NAND places, one package fewer", author: "designer", family: "cmos-hc-5v", settings: { form: "nand", fanIn: 4 } },
    ],
  },
  {
    name: "Status lamp decode",
    description: "Controller state code to the lock keeper's panel lamps, with lamp test",
    file: "status-lamps.fnb",
    steps: [
      { message: "Decode the six states to the panel lamps", author: "designer", family: "ttl-ls-5v", edit: withoutNever },
      { message: "Codes 6 and 7 are never sent: use them as don't-cares", author: "designer", family: "ttl-ls-5v" },
      { message: "Lamp drivers load each output like four inputs", author: "owner", family: "ttl-ls-5v", settings: { outputPinLoad: 4 } },
      { message: "Factored decode: the lamps share sub-expressions, one gate and one package fewer", author: "designer", family: "ttl-ls-5v", settings: { outputPinLoad: 4, structure: "factored" } },
    ],
  },
  {
    name: "Chamber level display",
    description: "4-bit level code (0 to 9) to one 7-segment digit",
    file: "level-display.fnb",
    steps: [
      { message: "Segments from the level code", author: "designer", family: "ttl-std-5v", edit: withoutNever },
      { message: "Codes 10 to 15 cannot come from the probe", author: "designer", family: "ttl-std-5v" },
      { message: "Display board runs at 3.3 V", author: "designer", family: "lvcmos-3v3" },
      { message: "Factored segment logic: six gates fewer on the 3.3 V board, same packages", author: "designer", family: "lvcmos-3v3", settings: { structure: "factored" } },
    ],
  },
  {
    name: "Paddle driver decode",
    description: "Raise and lower coils of four paddles, chosen by a 2-bit select, with enable",
    file: "paddle-driver.fnb",
    steps: [
      { message: "Coil decode with drive enable", author: "designer", family: "cmos-hct-5v" },
      { message: "Try NOR–NOR for the relay board", author: "designer", family: "cmos-hct-5v", settings: { form: "nor" } },
      { message: "Back to AND–OR; complemented selects come from the latch", author: "designer", family: "cmos-hct-5v", settings: { complementedInputs: true } },
      {
        message: "The select latch is low-power Schottky: check its outputs against our inputs",
        author: "designer", family: "cmos-hct-5v", settings: { complementedInputs: true, inputsDrivenBy: "ttl-ls-5v" },
      },
      {
        message: "Use the bench figures of the lock-cabinet batch",
        author: "owner", family: "ferrow-hct-cabinet", settings: { complementedInputs: true, inputsDrivenBy: "ttl-ls-5v" },
      },
    ],
  },
  {
    name: "Fault priority encoder",
    description: "Eight fault lines to a 3-bit code of the most urgent, and valid",
    file: "fault-priority.fnb",
    steps: [
      { message: "Priority encoder for the eight fault lines", author: "designer", family: "ttl-ls-5v" },
      { message: "Move to high-speed CMOS, four-input gates only", author: "designer", family: "cmos-hc-5v", settings: { fanIn: 4 } },
      { message: "Valid drives the alarm board and the logger: fan-out 4 to be safe", author: "owner", family: "cmos-hc-5v", settings: { fanIn: 4, fanOut: 4 } },
    ],
  },
  {
    name: "Weir sluice alarm",
    description: "Keeper's lamp and horn for the weir sluice, from the commissioning truth table",
    file: "sluice-alarm.csv",
    imported: { kind: "csv", outputs: ["alarm", "horn"] },
    steps: [
      { message: "Imported from the commissioning truth table sluice-alarm.csv (alarm and horn as outputs)", author: "designer", family: "ttl-ls-5v" },
      { message: "Sluice panel moves to high-speed CMOS like the lock controller", author: "designer", family: "cmos-hc-5v" },
    ],
  },
  {
    name: "Weir horn (relay board)",
    description: "The old relay board's horn and lamp logic, brought in from its Verilog model",
    file: "weir-horn.v",
    imported: { kind: "verilog" },
    steps: [
      { message: "Imported from the relay board's Verilog model weir-horn.v (module weir_horn)", author: "designer", family: "cmos-hct-5v" },
    ],
  },
];

/** Creates each demo design that does not exist yet, with its revisions. */
export async function seedDemoDesigns(
  models: Models,
  workspace: InstanceType<Models["Workspace"]>,
  users: Record<string, InstanceType<Models["User"]>>,
): Promise<number> {
  const { Design, Revision, LogicFamilyRecord } = models;
  // Built-ins first, then the workspace's own (the demo's bench family), which the steps may name too.
  const familyRows = [
    ...(await LogicFamilyRecord.findAll({ where: { workspaceId: { [Op.is]: null } } })),
    ...(await LogicFamilyRecord.findAll({ where: { workspaceId: workspace.id } })),
  ];
  const familyByKey = new Map(familyRows.map((f) => [f.key, f]));
  const familyOf = (key: string): Family => {
    const row = familyByKey.get(key);
    if (!row) throw new Error(`demo family ${key} missing: seed the built-in and the demo families first`);
    return { ...(row.data as unknown as Family), id: row.key, name: row.name };
  };
  const own = familyRows.filter((f) => f.workspaceId !== null).map((f) => familyOf(f.key));
  let created = 0;
  const day = 24 * 3600 * 1000;
  for (const [di, demo] of DEMO_DESIGNS.entries()) {
    if (await Design.findOne({ where: { workspaceId: workspace.id, name: demo.name } })) continue;
    const full = demo.imported ? importedSource(demo) : readFileSync(path.join(examples, demo.file), "utf8");
    const first = demo.steps[0]!;
    const design = await Design.create({
      workspaceId: workspace.id,
      name: demo.name,
      description: demo.description,
      familyId: familyByKey.get(first.family)!.id,
      settings: {},
      draftSource: "",
      createdBy: users.designer!.id,
      archivedAt: null,
    });
    let last: { source: string; family: string; settings: Settings } | null = null;
    for (const [i, step] of demo.steps.entries()) {
      const source = step.edit ? step.edit(full) : full;
      const settings = step.settings ?? {};
      const family = familyOf(step.family);
      const { result, error } = compileNow({ source, family, settings, families: own });
      if (!result) {
        throw new Error(`demo design "${demo.name}" revision ${i + 1} did not compile: ${error?.message ?? "errors"}`);
      }
      const stats = result.stats;
      await Revision.create({
        designId: design.id,
        number: i + 1,
        source,
        familyId: familyByKey.get(step.family)!.id,
        familySnapshot: { ...family },
        settings: { ...settings },
        stats: { ...stats },
        // The files of a revision come from the netlist saved with it.
        netlist: {
          model: result.model,
          document: result.document,
          critical: { nets: result.analysis.criticalPath.nets, gates: result.analysis.criticalPath.gates },
        } as unknown as Record<string, unknown>,
        authorId: users[step.author]!.id,
        message: step.message,
        // Spread the story over the past weeks, oldest first.
        createdAt: new Date(Date.now() - ((DEMO_DESIGNS.length - di) * 6 + (demo.steps.length - i)) * day),
      });
      last = { source, family: step.family, settings };
    }
    await design.update({ draftSource: last!.source, familyId: familyByKey.get(last!.family)!.id, settings: { ...last!.settings } });
    created++;
  }
  return created;
}
