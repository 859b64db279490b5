/**
 * Workspace administration in the Ferrow demo: the firm's own family (a copy
 * of a built-in with figures measured on its bench), a pending invitation, and
 * an activity list told from the seeded designs and revisions.
 */
import { Op } from "sequelize";
import type { CreationAttributes } from "sequelize";
import type { Activity, initModels } from "../../models";
import { builtInFamily, type Family } from "../families";
import { randomSecret, sha256 } from "../auth/secrets";

type Models = ReturnType<typeof initModels>;

const DAY = 24 * 3600 * 1000;
/** When the demo team joined: the owner a day before the others, who joined an hour apart, 40 days ago. */
const TEAM_START = new Date(Date.now() - 40 * DAY);
const JOIN_ORDER = ["designer", "reviewer", "viewer"] as const;
export function teamJoined(role: string): Date {
  const i = JOIN_ORDER.indexOf(role as (typeof JOIN_ORDER)[number]);
  return new Date(TEAM_START.getTime() + (i < 0 ? -DAY : i * 3600_000));
}

const MEASURED = "measured on the Ferrow bench: worst of 20 parts of the lock-cabinet batch at 70 °C, VCC = 4.5 V";

/**
 * The lock cabinets' high-speed CMOS with TTL-level inputs, as Ferrow's bench
 * measured its batch. Invented demo figures: where the bench found a part
 * worse than the standard allows for, or set a guard band, the measured
 * figure replaces the copy's; every other figure keeps the standard's source.
 */
export function benchFamily(): Family {
  const base = builtInFamily("cmos-hct-5v")!;
  const { builtIn: _b, ...rest } = base;
  return {
    ...rest,
    id: "ferrow-hct-cabinet",
    name: "Ferrow cabinet batch, HCT-type, bench figures",
    description:
      "Copy of the built-in high-speed CMOS with TTL-level inputs, with the figures Ferrow's bench measured on the lock-cabinet batch at 70 °C.",
    vihMin: 2.2,
    intrinsicNs: 12.5,
    ratedDrive: { ...base.ratedDrive!, vohMin: 3.9, volMax: 0.3, source: `${MEASURED}: VOH 3.9 V at −4 mA, VOL 0.3 V at 4 mA` },
    sources: {
      ...base.sources,
      vihMin: `${MEASURED}: highest input switching point 1.9 V, plus a 0.3 V guard band for the cabinet's long sensor leads`,
      intrinsicNs: `${MEASURED}: 2-input gate into 50 pF, 12.5 ns`,
    },
  };
}

/**
 * Adds the demo's own family, pending invitation and activity when the
 * workspace has none of them yet; safe to run again.
 */
export async function seedDemoFamily(models: Models, workspace: InstanceType<Models["Workspace"]>) {
  const fam = benchFamily();
  const [row] = await models.LogicFamilyRecord.findOrCreate({
    where: { workspaceId: workspace.id, key: fam.id },
    defaults: { workspaceId: workspace.id, key: fam.id, name: fam.name, builtin: false, data: { ...fam, builtIn: false } as unknown as Record<string, unknown> },
  });
  return row;
}

export async function seedDemoAdministration(
  models: Models,
  workspace: InstanceType<Models["Workspace"]>,
  users: Record<string, InstanceType<Models["User"]>>,
  bench: InstanceType<Models["LogicFamilyRecord"]>,
): Promise<void> {
  const { Invitation, Design, Revision } = models;
  if ((await models.Activity.count({ where: { workspaceId: workspace.id } })) > 0) return;
  const day = DAY;
  const owner = users.owner!;
  const entries: Array<CreationAttributes<Activity> & { createdAt: Date }> = [];
  const at = (d: Date) => ({ createdAt: d });
  const person = (u: InstanceType<Models["User"]>) => `${u.name} (${u.email})`;

  // The team as it came together, before the first design; the reviewer started as a viewer.
  for (const role of JOIN_ORDER) {
    const u = users[role]!;
    entries.push({
      workspaceId: workspace.id, actorId: u.id, action: "member.join", subjectKind: "membership", subjectId: u.id,
      subjectLabel: person(u), details: { role: role === "reviewer" ? "viewer" : role }, ...at(teamJoined(role)),
    });
  }
  const reviewer = users.reviewer!;
  entries.push({
    workspaceId: workspace.id, actorId: owner.id, action: "member.role", subjectKind: "membership", subjectId: reviewer.id,
    subjectLabel: person(reviewer), details: { from: "viewer", to: "reviewer" }, ...at(new Date(TEAM_START.getTime() + day)),
  });

  // Each demo design and revision, when it was made.
  const designs = await Design.findAll({ where: { workspaceId: workspace.id } });
  for (const d of designs) {
    const revs = await Revision.findAll({ where: { designId: d.id }, order: [["number", "ASC"]] });
    const first = revs[0]?.createdAt ?? d.createdAt;
    const family = revs[0] ? await models.LogicFamilyRecord.findByPk(revs[0].familyId) : null;
    entries.push({
      workspaceId: workspace.id, actorId: d.createdBy, action: "design.create", subjectKind: "design", subjectId: d.id,
      subjectLabel: d.name, details: family ? { family: family.name } : {}, ...at(new Date(first.getTime() - 3600_000)),
    });
    for (const r of revs) {
      entries.push({
        workspaceId: workspace.id, actorId: r.authorId, action: "design.revision", subjectKind: "design", subjectId: d.id,
        subjectLabel: d.name, details: { number: r.number, message: r.message }, ...at(r.createdAt),
      });
    }
  }

  // The bench family, added before the revision that uses it.
  const benchUse = await Revision.findOne({ where: { familyId: bench.id }, order: [["createdAt", "ASC"]] });
  const benchAt = new Date((benchUse?.createdAt.getTime() ?? Date.now()) - 2 * day);
  entries.push({
    workspaceId: workspace.id, actorId: owner.id, action: "family.create", subjectKind: "family", subjectId: bench.id,
    subjectLabel: bench.name, details: { key: bench.key, copiedFrom: builtInFamily("cmos-hct-5v")!.name }, ...at(benchAt),
  });

  // A lock keeper invited to review, who has not answered yet.
  const email = "lockkeeper@ferrow.example";
  const open = await Invitation.findOne({ where: { workspaceId: workspace.id, email, acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null } } });
  const invitedAt = new Date(Date.now() - 2 * day);
  const inv =
    open ??
    (await Invitation.create({
      workspaceId: workspace.id, email, role: "reviewer", tokenHash: sha256(randomSecret()), invitedBy: owner.id,
      // The link itself was never mailed from the seed; the owner sends it again from the Members page.
      expiresAt: new Date(invitedAt.getTime() + 7 * day), acceptedAt: null, revokedAt: null,
    }));
  entries.push({
    workspaceId: workspace.id, actorId: owner.id, action: "invitation.create", subjectKind: "invitation", subjectId: inv.id,
    subjectLabel: email, details: { role: "reviewer" }, ...at(invitedAt),
  });

  entries.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
  for (const e of entries) await models.Activity.create(e);
}
