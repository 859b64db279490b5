/**
 * The demo reviews of Ferrow Lock & Weir: the reviewer approved the chamber
 * interlock's impossible combination, sent the paddle driver's NOR–NOR trial
 * back and approved the return to AND–OR, and has an open question on the
 * interlock's NAND–NAND revision — why the override key bypasses the
 * level-equal check — with the designer's answer on the same line.
 */
import { Op } from "sequelize";
import type { initModels, ReviewVerdict } from "../../models";

type Models = ReturnType<typeof initModels>;
type Who = "owner" | "designer" | "reviewer";

interface DemoComment {
  by: Who;
  /** The comment sits on the first line of the revision's source that starts with this text; none: a general comment. */
  on?: string;
  body: string;
}

interface DemoReview {
  design: string;
  revision: number;
  askedBy: Who;
  reviewers: Who[];
  message: string;
  comments: DemoComment[];
  decisions: Array<{ by: Who; verdict: Extract<ReviewVerdict, "approved" | "changes-asked">; note: string }>;
}

export const DEMO_REVIEWS: DemoReview[] = [
  {
    design: "Chamber interlock",
    revision: 2,
    askedBy: "designer",
    reviewers: ["reviewer"],
    message: "Added the level-with-both-pounds combination as impossible. Please check that it really cannot happen on site.",
    comments: [
      { by: "reviewer", on: "never level_upper", body: "Agreed: the chamber cannot stand level with the upper and the lower pound at once. If both sensors read high, that is a sensor fault, and the fault encoder should report it." },
      { by: "designer", on: "never level_upper", body: "Noted; I will add a sensor-disagree line to the fault priority encoder." },
    ],
    decisions: [{ by: "reviewer", verdict: "approved", note: "The impossible combination matches the site. Approved." }],
  },
  {
    design: "Paddle driver decode",
    revision: 2,
    askedBy: "designer",
    reviewers: ["reviewer"],
    message: "Trying NOR–NOR for the relay board. Does it pay for itself?",
    comments: [
      { by: "reviewer", body: "The relay board's latch gives us both polarities of the selects, so the inverters in front of the NORs are wasted there. Compare the package count with r1 before we commit." },
    ],
    decisions: [{ by: "reviewer", verdict: "changes-asked", note: "Go back to AND–OR and take the complemented selects from the latch; then ask again." }],
  },
  {
    design: "Paddle driver decode",
    revision: 3,
    askedBy: "designer",
    reviewers: ["reviewer"],
    message: "Back to AND–OR with the complemented selects from the latch, as asked.",
    comments: [{ by: "designer", body: "The select inverters are gone from the coil lines." }],
    decisions: [{ by: "reviewer", verdict: "approved", note: "Fewer parts and the same coil timing. Approved for the relay board." }],
  },
  {
    design: "Chamber interlock",
    revision: 4,
    askedBy: "designer",
    reviewers: ["reviewer", "owner"],
    message: "NAND–NAND fit for the spare two-input NANDs on the controller board. The logic is unchanged from r3.",
    comments: [
      {
        by: "reviewer",
        on: "open_upper =",
        body: "Why does the override key bypass the level-equal check here? With the key turned, the upper gate may open against a head of water.",
      },
      {
        by: "designer",
        on: "open_upper =",
        body: "The keeper uses the key when a level sensor has failed; the alarm sounds whenever the key is used with a gate open (see the alarm line). I can add the far gate's shut switch as a second condition if you want it.",
      },
      { by: "reviewer", on: "alarm =", body: "The alarm sounds only once a gate is open. Can it sound while the key is turned at all, so the keeper hears it before the gate moves?" },
      { by: "reviewer", body: "Before I approve: with two-input NANDs the permits go several levels deep. Check the delay against the gate motor contactor's pull-in time." },
    ],
    decisions: [],
  },
];

/** Adds the demo reviews to designs that have none yet. */
export async function seedDemoReviews(
  models: Models,
  workspace: InstanceType<Models["Workspace"]>,
  users: Record<string, InstanceType<Models["User"]>>,
): Promise<number> {
  const { Design, Revision, Review, ReviewReviewer, ReviewComment, ReviewDecision } = models;
  const hour = 3600 * 1000;
  let created = 0;
  const designs = await Design.findAll({ where: { workspaceId: workspace.id, name: { [Op.in]: [...new Set(DEMO_REVIEWS.map((d) => d.design))] } } });
  // A design that has reviews already keeps them as they are: the seed runs again safely.
  const reviewed = new Set((await Review.findAll({ where: { designId: { [Op.in]: designs.map((d) => d.id) } }, attributes: ["designId"] })).map((r) => r.designId));
  for (const demo of DEMO_REVIEWS) {
    const design = designs.find((d) => d.name === demo.design);
    if (!design || reviewed.has(design.id)) continue;
    const rev = await Revision.findOne({ where: { designId: design.id, number: demo.revision } });
    if (!rev) continue;
    const t0 = rev.createdAt.getTime();
    const at = (h: number) => new Date(t0 + h * hour);
    const review = await Review.create({
      designId: design.id, revisionId: rev.id, requestedBy: users[demo.askedBy]!.id, message: demo.message, createdAt: at(1), updatedAt: at(1),
    });
    for (const who of demo.reviewers) await ReviewReviewer.create({ reviewId: review.id, userId: users[who]!.id, createdAt: at(1) });
    const lines = rev.source.split("\n");
    for (const [i, c] of demo.comments.entries()) {
      const line = c.on ? lines.findIndex((l) => l.trimStart().startsWith(c.on!)) + 1 : 0;
      if (c.on && line === 0) throw new Error(`demo review of ${demo.design} r${demo.revision}: no line starts with "${c.on}"`);
      await ReviewComment.create({ reviewId: review.id, authorId: users[c.by]!.id, body: c.body, line: line || null, createdAt: at(2 + i) });
    }
    for (const [i, d] of demo.decisions.entries()) {
      await ReviewDecision.create({ reviewId: review.id, revisionId: rev.id, userId: users[d.by]!.id, verdict: d.verdict, note: d.note, createdAt: at(8 + i) });
    }
    // The same rule as lib/data/reviews: sent back by anyone, approved by everyone asked.
    const state = demo.decisions.some((d) => d.verdict === "changes-asked")
      ? "changes-asked"
      : demo.reviewers.every((w) => demo.decisions.some((d) => d.by === w && d.verdict === "approved")) ? "approved" : "open";
    if (state !== "open") {
      await Review.update({ state, updatedAt: at(8 + demo.decisions.length) }, { where: { id: review.id }, silent: true });
    }
    created++;
  }
  return created;
}
