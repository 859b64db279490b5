/**
 * The demo library of Ferrow Lock & Weir, "Ferrow lock blocks", and the demo
 * designs that use it. Three blocks, each with revisions that tell how it
 * grew; one design follows the library's current blocks, the other is one
 * revision behind, so its workbench offers the newer one with the figure
 * deltas. Every figure stored comes from running the real pipeline.
 */
import { Op } from "sequelize";
import type { initModels } from "../../models";
import { BUILT_IN_FAMILIES } from "../families";
import { checkLibraryBlock, requestKey, resolverFrom, type LibraryAnswer } from "../lang";
import { compileNow, type DesignSettings } from "../pipeline";

type Models = ReturnType<typeof initModels>;

export const DEMO_LIBRARY = { key: "lock-blocks", name: "Ferrow lock blocks", description: "Proven pieces of the lock controllers: sensor votes, the gate interlock core, level decoding" };

interface BlockStep {
  message: string;
  author: "designer" | "owner";
  family: string;
  source: string;
}

const VOTE = `// Two-of-three vote of redundant sensors: m is 1 when at least two of a, b, c are.
inputs a, b, c
outputs m

m = a * b + a * c + b * c
`;

const CORE_1 = `// Gate interlock core for one gate of a chamber.
// other_shut: the gate at the other end is shut; level: the chamber is level with the pound beyond this gate;
// key: the lock keeper's override key; estop: the emergency stop is pressed.
inputs other_shut, level, key, estop
outputs permit, key_alarm

let safe = estop'
permit = safe * other_shut * (level + key)
key_alarm = key * other_shut'            // the key is turned while the other gate stands open
`;

const CORE_2 = CORE_1.replace(
  "key_alarm = key * other_shut'            // the key is turned while the other gate stands open",
  "key_alarm = estop + key * other_shut'    // an emergency stop, or the key turned while the other gate stands open",
);

const DECODE_1 = `// Level-code decoder: the probe's 4-bit code l3 l2 l1 l0 (0 to 9, in half metres) to three bands.
inputs l3, l2, l1, l0
outputs low, mid, high

low = on(0..2)
mid = on(3..6)
high = on(7..9)
`;

const DECODE_2 = DECODE_1.replace("outputs low, mid, high\n", "outputs low, mid, high\n\nnever l3 * l2 + l3 * l1                 // codes 10 to 15 cannot come from the probe\n");

export const DEMO_BLOCKS: Array<{ name: string; steps: BlockStep[] }> = [
  {
    name: "vote2of3",
    steps: [
      { message: "Two-of-three vote of the level sensors", author: "designer", family: "ttl-std-5v", source: VOTE },
      { message: "Figures for the high-speed CMOS controller board", author: "designer", family: "cmos-hc-5v", source: VOTE },
    ],
  },
  {
    name: "gate_core",
    steps: [
      { message: "Gate permit and key alarm, taken from the chamber interlock", author: "designer", family: "ttl-std-5v", source: CORE_1 },
      { message: "The alarm also sounds on an emergency stop", author: "owner", family: "cmos-hc-5v", source: CORE_2 },
    ],
  },
  {
    name: "level_decode",
    steps: [
      { message: "Level bands from the probe code", author: "designer", family: "ttl-std-5v", source: DECODE_1 },
      { message: "Codes 10 to 15 cannot come from the probe", author: "designer", family: "ttl-std-5v", source: DECODE_2 },
    ],
  },
];

const VOTED_INTERLOCK = (vote: number, core: number) => `// Ferrow Lock & Weir: chamber interlock with three level sensors on each side,
// built from the lock-blocks library: a two-of-three vote per side and the gate interlock core per gate.
inputs upper_shut, lower_shut, lu1, lu2, lu3, ll1, ll2, ll3, key, estop
outputs open_upper, open_lower, alarm

use vote2of3 from "${DEMO_LIBRARY.key}" at ${vote}
use gate_core from "${DEMO_LIBRARY.key}" at ${core}

let level_upper = vote2of3(lu1, lu2, lu3)
let level_lower = vote2of3(ll1, ll2, ll3)
let (permit_upper, alarm_upper) = gate_core(lower_shut, level_upper, key, estop)
let (permit_lower, alarm_lower) = gate_core(upper_shut, level_lower, key, estop)

open_upper = permit_upper
open_lower = permit_lower
alarm = alarm_upper + alarm_lower
`;

const BAND_LAMPS = (lampTest: boolean) => `// Ferrow Lock & Weir: the keeper's three level-band lamps, from the probe code.
inputs l3, l2, l1, l0${lampTest ? ", lamp_test" : ""}
outputs lamp_low, lamp_mid, lamp_high

use level_decode from "${DEMO_LIBRARY.key}" at 1

let (low, mid, high) = level_decode(l3, l2, l1, l0)
lamp_low = low${lampTest ? " + lamp_test" : ""}
lamp_mid = mid${lampTest ? " + lamp_test" : ""}
lamp_high = high${lampTest ? " + lamp_test" : ""}
`;

interface DesignStep {
  message: string;
  author: "designer" | "owner";
  family: string;
  settings?: DesignSettings;
  source: string;
}

export const DEMO_LIBRARY_DESIGNS: Array<{ name: string; description: string; steps: DesignStep[] }> = [
  {
    name: "Gate permits, voted level sensors",
    description: "Gate permits and alarm with three level sensors per side, from the lock-blocks library",
    steps: [
      { message: "Permits from the library's vote and gate core", author: "designer", family: "ttl-std-5v", source: VOTED_INTERLOCK(1, 1) },
      { message: "Move to the library's current blocks: the stop sounds the alarm; high-speed CMOS", author: "designer", family: "cmos-hc-5v", source: VOTED_INTERLOCK(2, 2) },
    ],
  },
  {
    name: "Level band lamps",
    description: "Low, middle and high level lamps for the keeper's panel, from the library's level decoder",
    steps: [
      { message: "Band lamps from the library's level decoder", author: "designer", family: "ttl-ls-5v", source: BAND_LAMPS(false) },
      { message: "Lamp test lights all three", author: "designer", family: "ttl-ls-5v", source: BAND_LAMPS(true) },
    ],
  },
];

const family = (id: string) => BUILT_IN_FAMILIES.find((f) => f.id === id)!;

/**
 * Creates the demo library with its block revisions, and the demo designs
 * that use it, where missing. Returns the number of designs created.
 */
export async function seedDemoLibraries(
  models: Models,
  workspace: InstanceType<Models["Workspace"]>,
  users: Record<string, InstanceType<Models["User"]>>,
): Promise<number> {
  const { Library, LibraryBlock, LibraryRevision, LogicFamilyRecord, Design, Revision, RevisionLibrary } = models;
  const familyRows = await LogicFamilyRecord.findAll({ where: { workspaceId: { [Op.is]: null } } });
  const familyByKey = new Map(familyRows.map((f) => [f.key, f]));
  const day = 24 * 3600 * 1000;

  const [library] = await Library.findOrCreate({
    where: { workspaceId: workspace.id, key: DEMO_LIBRARY.key },
    defaults: { workspaceId: workspace.id, key: DEMO_LIBRARY.key, name: DEMO_LIBRARY.name, description: DEMO_LIBRARY.description, createdBy: users.designer!.id },
  });
  const ids = new Map<string, string>();
  const answers = new Map<string, LibraryAnswer>();
  for (const [bi, demo] of DEMO_BLOCKS.entries()) {
    const [block] = await LibraryBlock.findOrCreate({ where: { libraryId: library.id, name: demo.name }, defaults: { libraryId: library.id, name: demo.name } });
    for (const [i, step] of demo.steps.entries()) {
      const number = i + 1;
      let rev = await LibraryRevision.findOne({ where: { blockId: block.id, number } });
      if (!rev) {
        const ports = checkLibraryBlock(step.source);
        if (ports.diagnostics.some((d) => d.severity === "error")) throw new Error(`demo block ${demo.name} r${number}: ${JSON.stringify(ports.diagnostics)}`);
        const { result, error } = compileNow({ source: step.source, family: family(step.family) });
        if (!result) throw new Error(`demo block ${demo.name} r${number} did not compile: ${error?.message ?? "errors"}`);
        rev = await LibraryRevision.create({
          blockId: block.id, number, source: step.source, message: step.message,
          inputs: ports.inputs, outputs: ports.outputs,
          familyId: familyByKey.get(step.family)!.id, familySnapshot: { ...family(step.family) }, settings: {},
          stats: { ...result.stats }, verification: result.verification ? { ...result.verification } : null,
          authorId: users[step.author]!.id, needsReview: false,
          // Published over the weeks before the designs that use them.
          createdAt: new Date(Date.now() - (60 - bi * 6 - i * 14) * day),
        });
      }
      ids.set(`${demo.name}@${number}`, rev.id);
      answers.set(requestKey({ library: DEMO_LIBRARY.key, block: demo.name, revision: number }), { ok: true, source: rev.source, revision: number, latest: demo.steps.length });
    }
  }
  const resolve = resolverFrom(answers, (r) => `the demo library has no ${r.block} at ${r.revision}`);

  let created = 0;
  for (const [di, demo] of DEMO_LIBRARY_DESIGNS.entries()) {
    if (await Design.findOne({ where: { workspaceId: workspace.id, name: demo.name } })) continue;
    const first = demo.steps[0]!;
    const design = await Design.create({
      workspaceId: workspace.id, name: demo.name, description: demo.description, familyId: familyByKey.get(first.family)!.id,
      settings: {}, draftSource: "", createdBy: users.designer!.id, archivedAt: null,
    });
    for (const [i, step] of demo.steps.entries()) {
      const settings = step.settings ?? {};
      const { result, error, libraries } = compileNow({ source: step.source, family: family(step.family), settings, resolve });
      if (!result) throw new Error(`demo design "${demo.name}" revision ${i + 1} did not compile: ${error?.message ?? "errors"}`);
      const rev = await Revision.create({
        designId: design.id, number: i + 1, source: step.source, familyId: familyByKey.get(step.family)!.id,
        familySnapshot: { ...family(step.family) }, settings: { ...settings }, stats: { ...result.stats },
        // As saved revisions keep it: the netlist, its document and the critical path (for the compare view).
        netlist: {
          model: result.model,
          document: result.document,
          critical: { nets: result.analysis.criticalPath.nets, gates: result.analysis.criticalPath.gates },
        } as unknown as Record<string, unknown>,
        authorId: users[step.author]!.id, message: step.message,
        createdAt: new Date(Date.now() - ((DEMO_LIBRARY_DESIGNS.length - di) * 4 + (demo.steps.length - i)) * day),
      });
      for (const u of libraries) {
        await RevisionLibrary.create({ revisionId: rev.id, libraryRevisionId: ids.get(`${u.block}@${u.revision}`)!, library: u.library, block: u.block });
      }
    }
    const last = demo.steps[demo.steps.length - 1]!;
    await design.update({ draftSource: last.source, familyId: familyByKey.get(last.family)!.id, settings: { ...(last.settings ?? {}) } });
    created++;
  }
  return created;
}
