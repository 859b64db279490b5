/**
 * Every REST route under /api/v1: its schemas and its summary. Route handlers
 * wrap these specs with `handle`; the OpenAPI document is built from them.
 */
import { z } from "zod";
import { defineRoute } from "./registry";
import type { LimitName } from "./limits";
import { passwordProblem } from "../auth/password-policy";
import { designSettingsSchema } from "../pipeline/settings";
import { CompileResponse, CompileResultBody, Diagnostic } from "./compile-schema";
import { IMPORT_MAX_CHARS } from "../import/truth-table";
// Kept here rather than imported from models/, so this module stays free of Sequelize.
const ROLES = ["owner", "designer", "reviewer", "viewer"] as const;

// ---- shared pieces -------------------------------------------------------------

/** Design settings as the API takes them: the pipeline's; the family is given apart (a familyId inside is dropped). */
export const CompileSettings = designSettingsSchema;

const Slug = z.string().regex(/^[a-z0-9][a-z0-9-]{1,62}$/, "2–63 lower-case letters, digits or dashes, starting with a letter or digit");
const Id = z.uuid();
const Email = z.string().trim().toLowerCase().pipe(z.email()).pipe(z.string().max(254));
const Name = z.string().trim().min(1, "must not be empty").max(120);
// Length here; what the password is made of is checked against the account in lib/auth/password-policy.ts.
const Password = z.string().min(10, "use at least 10 characters").max(200);
const Callback = z.string().max(500).optional();
const Role = z.enum(ROLES);
const Json = z.record(z.string(), z.unknown());
const Source = z.string().max(200_000);
const Ref = z.object({ id: z.string(), name: z.string() });
const FamilyRef = z.object({ id: z.string(), key: z.string(), name: z.string() });
const Page = { limit: z.coerce.number().int().min(1).max(200).optional(), cursor: z.string().max(64).optional() };

/** A located import message; truth-table messages also name the row and the column. */
const ImportDiagnostic = Diagnostic.extend({ row: z.number().optional(), col: z.number().optional(), colName: z.string().optional() });
const ImportText = z.string().max(IMPORT_MAX_CHARS, `at most ${IMPORT_MAX_CHARS} characters (IMPORT_MAX_CHARS)`);
const ImportRequest = {
  kind: z.enum(["csv", "verilog"]).describe("csv: a truth table (comma, semicolon or tab separated); verilog: one module of continuous assigns"),
  text: ImportText,
  outputs: z.array(z.string().trim().min(1).max(120)).max(2000).optional().describe("truth tables only: the output columns; default the last column"),
  fileName: z.string().max(200).optional().describe("where the text came from, for the comment at the top of the source"),
};
/** Bodies of import requests: the text JSON-escaped (tabs and line breaks double), plus room for the other fields. */
export const IMPORT_BODY_BYTES = 2 * IMPORT_MAX_CHARS + 64 * 1024;
const ImportOutcome = z.object({
  source: z.string().nullable(),
  inputs: z.array(z.string()),
  outputs: z.array(z.string()),
  diagnostics: z.array(ImportDiagnostic),
});

export const ErrorShape = z.object({
  error: z.object({ code: z.string(), message: z.string(), details: z.unknown() }),
});

const WsParams = z.object({ ws: Slug });
const DesignParams = WsParams.extend({ designId: Id });
const RevisionParams = DesignParams.extend({ number: z.coerce.number().int().positive() });

const Workspace = z.object({ id: z.string(), slug: z.string(), name: z.string(), role: Role, settings: Json });
const Member = z.object({ userId: z.string(), email: z.string(), name: z.string(), role: Role, joinedAt: z.string() });
const Invitation = z.object({
  id: z.string(),
  email: z.string(),
  role: Role,
  status: z.enum(["open", "accepted", "revoked", "expired"]),
  expiresAt: z.string(),
  createdAt: z.string(),
  invitedBy: Ref,
});
const Family = z.object({
  id: z.string(),
  key: z.string(),
  name: z.string(),
  builtin: z.boolean(),
  fanIn: z.number().nullable(),
  fanOut: z.number().nullable(),
  data: Json,
  archivedAt: z.string().nullable().describe("set when an owner archived it: kept for what used it, not offered for new designs"),
});
const Verdict = z.enum(["compatible", "small-margin", "not-compatible", "unknown"]);
const CompatibilityPair = z.object({
  driver: z.string().describe("driver family key"),
  receiver: z.string().describe("receiver family key"),
  nmhV: z.number().nullable().describe("NMH = VOH(min) of the driver − VIH(min) of the receiver, V"),
  nmlV: z.number().nullable().describe("NML = VIL(max) of the receiver − VOL(max) of the driver, V"),
  fanOutHigh: z.number().nullable().describe("receiver inputs one output may hold high: floor(|IOH| / IIH)"),
  fanOutLow: z.number().nullable().describe("receiver inputs one output may hold low: floor(IOL / |IIL|)"),
  verdict: Verdict,
  fanOutAc: z.number().nullable().describe("receiver inputs within the receiver's edge-rate limit"),
  point: z.enum(["light", "rated"]).nullable().describe("the driver's output operating point the figures use"),
  formulas: z.object({ nmh: z.string(), nml: z.string(), fanOutHigh: z.string(), fanOutLow: z.string(), fanOutAc: z.string() }),
  messages: z.array(z.string()),
});
const ActivityEntry = z.object({
  id: z.string(),
  at: z.string(),
  actor: Ref.nullable(),
  action: z.string().describe("e.g. member.role, invitation.create, family.archive, design.rename, design.revision"),
  subject: z.object({ kind: z.enum(["membership", "invitation", "family", "design", "library"]), id: z.string().nullable(), label: z.string() }),
  details: Json,
  summary: z.string().describe("the entry in words, to follow the actor's name"),
});
const LatestRevision = z.object({ number: z.number(), createdAt: z.string(), message: z.string(), author: Ref, stats: Json });
const DesignSummary = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  family: FamilyRef,
  latestRevision: LatestRevision.nullable(),
  updatedAt: z.string(),
  archivedAt: z.string().nullable(),
  createdBy: Ref,
});
const DesignDetail = DesignSummary.extend({
  draftSource: z.string(),
  settings: Json,
  draftVersion: z.number().int().describe("bumped by every write of the draft; send it back as baseVersion"),
  draftUpdatedAt: z.string().nullable(),
  draftUpdatedBy: Ref.nullable(),
});
/** The draft as a 409 from PUT …/draft reports it in details.draft. */
export const Draft = z.object({
  source: z.string(),
  familyId: z.string(),
  settings: Json,
  version: z.number().int(),
  updatedAt: z.string().nullable(),
  updatedBy: Ref.nullable(),
});
const RevisionSummary = z.object({
  id: z.string(),
  number: z.number(),
  message: z.string(),
  author: Ref,
  createdAt: z.string(),
  stats: Json,
  family: FamilyRef,
});
const PinnedBlock = z.object({ library: z.string(), block: z.string(), revision: z.number() });
const RevisionDetail = RevisionSummary.extend({
  source: z.string(),
  settings: Json,
  familySnapshot: Json,
  libraries: z.array(PinnedBlock).describe("the library block revisions this revision used, pinned with it"),
});

const LibraryKey = z.string().regex(/^[a-z0-9][a-z0-9-]{0,63}$/, "1–64 lower-case letters, digits or dashes, starting with a letter or digit");
const BlockName = z.string().min(1).max(64).describe("a name of the language: letters, digits and _, not starting with a digit");
const LibraryParams = WsParams.extend({ libraryId: Id });
const FigureDelta = z.object({ figure: z.string(), label: z.string(), unit: z.string(), from: z.number().nullable(), to: z.number().nullable(), delta: z.number().nullable() });
const LibraryRevision = z.object({
  id: z.string(),
  number: z.number(),
  message: z.string(),
  state: z.enum(["published", "awaiting review"]).describe("awaiting review: published while the workspace asks for an approved review first; it may be used once approved"),
  author: Ref,
  createdAt: z.string(),
  inputs: z.array(z.string()).describe("the block's inputs in order: the parameters of a call"),
  outputs: z.array(z.string()).describe("the block's outputs in order: the results of a call"),
  family: FamilyRef,
  stats: Json.describe("figures computed when it was published, under its family; delay and power are estimates"),
  usedBy: z.array(z.object({ design: Ref, revisions: z.array(z.number()) })).optional().describe("designs of your workspace whose saved revisions use it"),
  deltas: z.array(FigureDelta).nullable().optional().describe("against the revision before it"),
});
const LibraryBlock = z.object({ name: z.string(), latest: z.number().nullable(), revisions: z.array(LibraryRevision) });
const Library = z.object({
  id: z.string(),
  key: z.string(),
  name: z.string(),
  description: z.string(),
  ref: z.string().describe('how use lines in this workspace write it: "key", or "slug/key" for a library shared with it'),
  owner: z.object({ slug: z.string(), name: z.string() }),
  sharedIn: z.boolean().describe("it belongs to another workspace and is shared with this one read-only"),
  mayPublish: z.boolean(),
  requireReview: z.boolean(),
  createdAt: z.string(),
  blocks: z.array(LibraryBlock),
});
const LibraryDetail = Library.extend({
  shares: z.array(z.object({ workspace: z.object({ slug: z.string(), name: z.string() }), createdAt: z.string(), by: Ref })).nullable(),
});
const UseRequest = z.object({ library: z.string().max(200), block: z.string().max(64), revision: z.number().int().positive().nullable() });
const Token = z.object({
  id: z.string(),
  name: z.string(),
  prefix: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
const Job = z.object({
  id: z.string(),
  status: z.enum(["queued", "running", "done", "failed", "cancelled"]),
  stage: z.string().nullable().describe("minimize, map, factor, analyse or export"),
  cost: z.number().nullable().describe("cost of the best cover so far"),
  lowerBound: z.number().nullable().describe("proven lower bound on the cost"),
  primes: z.number().nullable().describe("prime implicants found so far; null until known, and on the heuristic alone"),
  error: z.object({ code: z.string(), message: z.string(), what: z.string().optional(), hint: z.string().optional() }).nullable(),
  attempt: z.number().describe("workers that have taken it; above 1 when a worker stopped and another took over"),
  designId: z.string().nullable(),
  createdBy: Ref,
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
  result: CompileResultBody.nullable(),
});
const Accepted = z.object({ ok: z.literal(true), message: z.string() });

// ---- review shapes -------------------------------------------------------------
const REVIEW_STATES = ["open", "approved", "changes-asked", "withdrawn", "superseded"] as const;
const REVIEW_VERDICTS = ["approved", "changes-asked", "withdrawn", "superseded"] as const;
const ReviewText = z.string().max(4000, "keep it under 4000 characters");
const ReviewParams = WsParams.extend({ reviewId: Id });
const Reviewer = Ref.extend({ verdict: z.enum(["approved", "changes-asked"]).nullable(), decidedAt: z.string().nullable() });
const ReviewSummary = z.object({
  id: z.string(),
  design: z.object({ id: z.string(), name: z.string() }),
  revision: z.object({ number: z.number(), message: z.string(), author: Ref }),
  state: z.enum(REVIEW_STATES),
  message: z.string(),
  requestedBy: Ref,
  reviewers: z.array(Reviewer),
  commentCount: z.number(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
const Decision = z.object({
  id: z.string(),
  reviewId: z.string(),
  design: z.object({ id: z.string(), name: z.string() }),
  revision: z.number().describe("number of the revision decided on"),
  verdict: z.enum(REVIEW_VERDICTS),
  note: z.string(),
  user: Ref,
  createdAt: z.string(),
});
const ReviewDetail = ReviewSummary.extend({
  comments: z.array(z.object({ id: z.string(), author: Ref, body: z.string(), line: z.number().nullable(), createdAt: z.string() })),
  decisions: z.array(Decision),
  compareFrom: z.number().nullable(),
});
const Figures = z.object({
  gates: z.number(), depth: z.number(), packages: z.number().nullable(), transistors: z.number().nullable(),
  delayNs: z.number().nullable().describe("estimate, ns"), staticMw: z.number().nullable().describe("estimate, mW"),
  dynamicMw: z.number().nullable().describe("estimate, mW"), maxLoad: z.number().describe("unit loads"),
  fanOut: z.number().nullable().describe("the limit maxLoad is held against, unit loads"),
  products: z.number(), literals: z.number(), exact: z.boolean(),
  outputs: z.array(z.object({ name: z.string(), products: z.number(), literals: z.number(), exact: z.boolean() })).nullable(),
  byTypeWidth: z.array(z.object({ type: z.string(), width: z.number(), count: z.number() })),
  family: z.object({ id: z.string(), name: z.string() }),
  settings: Json,
});
const RevisionSide = z.object({
  revision: z.object({ number: z.number(), message: z.string(), author: Ref, createdAt: z.string() }),
  figures: Figures,
  source: z.string(),
  netlist: Json.nullable().describe("the JSON netlist document saved with the revision"),
  critical: z.object({ nets: z.array(z.string()), gates: z.array(z.string()) }),
});
const SourceDiff = z.object({
  lines: z.array(z.object({ kind: z.enum(["same", "removed", "added"]), from: z.number().nullable(), to: z.number().nullable(), text: z.string() })),
  added: z.number(),
  removed: z.number(),
});
const Direction = z.enum(["better", "worse", "same", "mixed", "unknown"]);
const Comparison = z.object({
  figures: z.array(z.object({ key: z.string(), from: z.number().nullable(), to: z.number().nullable(), delta: z.number().nullable(), direction: Direction })),
  load: z.object({ from: Json, to: Json, delta: z.number(), direction: Direction }),
  exact: z.object({ from: z.boolean(), to: z.boolean(), direction: Direction }),
  outputs: z.array(Json).nullable(),
  outputsRecorded: z.object({ from: z.boolean(), to: z.boolean() }),
  family: z.object({ from: Json, to: Json }).nullable(),
  settings: z.array(z.object({ key: z.string(), from: z.unknown(), to: z.unknown() })),
  netlist: z.object({
    rows: z.array(z.object({ type: z.string(), width: z.number(), from: z.number(), to: z.number(), added: z.number(), removed: z.number() })),
    added: z.number(),
    removed: z.number(),
  }),
});

const R = [401, 429];
const WS = [400, 401, 403, 404];

// ---- account ------------------------------------------------------------------

export const routes = {
  me: defineRoute({
    method: "GET", path: "/me", tag: "account", auth: "user", summary: "The caller and their workspaces",
    response: z.object({
      user: z.object({ id: z.string(), email: z.string(), name: z.string(), emailConfirmed: z.boolean().describe("a link mailed to the address was followed") }),
      workspaces: z.array(Workspace.omit({ settings: true })),
    }),
    errors: [401],
  }),
  signUp: defineRoute({
    method: "POST", path: "/auth/signup", tag: "account", auth: "none",
    summary: "Create an account with e-mail and password, and mail a link that confirms the address (answers the same when the address has an account already: its owner gets a note instead)",
    // The password is judged with the address and name it goes with, before any limit is counted.
    body: z.object({ email: Email, name: Name, password: Password, callbackUrl: Callback }).strict().superRefine((b, ctx) => {
      const problem = passwordProblem(b.password, b);
      if (problem) ctx.addIssue({ code: "custom", path: ["password"], message: problem });
    }),
    response: Accepted, status: 202, errors: [400, 413, 415, 429],
    limits: ["signUp", "mailAddress", "mailCaller"],
  }),
  verifyEmail: defineRoute({
    method: "POST", path: "/auth/verify-email", tag: "account", auth: "none",
    summary: "Confirm an account's e-mail address with the secret from the mail sent at sign-up",
    body: z.object({ token: z.string().min(10).max(200) }).strict(),
    response: z.object({ ok: z.literal(true), email: z.string() }), errors: [400, 413, 415, 429],
    limits: ["mailSecret"],
  }),
  emailLink: defineRoute({
    method: "POST", path: "/auth/email-link", tag: "account", auth: "none",
    summary: "Mail a one-time sign-in link, which also confirms the address (answers the same whether or not the address has an account)",
    body: z.object({ email: Email, callbackUrl: Callback }).strict(),
    response: Accepted, status: 202, errors: [400, 413, 415, 429],
    limits: ["mailAddress", "mailCaller"],
  }),
  passwordReset: defineRoute({
    method: "POST", path: "/auth/password-reset", tag: "account", auth: "none",
    summary: "Mail a password-reset link (answers the same whether or not the address has an account)",
    body: z.object({ email: Email }).strict(),
    response: Accepted, status: 202, errors: [400, 413, 415, 429],
    limits: ["mailAddress", "mailCaller"],
  }),
  passwordResetComplete: defineRoute({
    method: "POST", path: "/auth/password-reset/complete", tag: "account", auth: "none",
    summary: "Set a new password with the secret from the reset mail; every session of the account ends, and its API tokens too when revokeApiTokens is true",
    body: z.object({
      token: z.string().min(10).max(200),
      password: Password,
      revokeApiTokens: z.boolean().default(false).describe("also revoke every personal API token of the account"),
    }).strict(),
    response: z.object({ ok: z.literal(true), tokensRevoked: z.number() }), errors: [400, 413, 415, 429],
    limits: ["mailSecret"],
  }),
  endSessions: defineRoute({
    method: "POST", path: "/me/sessions/end", tag: "account", auth: "user",
    summary: "Sign out everywhere: every session of the caller's account ends, this one included (API tokens stay)",
    body: z.object({}).strict(),
    response: z.object({ ok: z.literal(true) }), errors: [401, 413, 415, 429],
    limits: ["sessions"],
  }),
  listTokens: defineRoute({
    method: "GET", path: "/tokens", tag: "tokens", auth: "user", summary: "The caller's personal API tokens",
    response: z.object({ items: z.array(Token) }), errors: [401],
  }),
  createToken: defineRoute({
    method: "POST", path: "/tokens", tag: "tokens", auth: "user",
    summary: "Create a personal API token; the secret is in this response only",
    body: z.object({
      name: z.string().trim().min(1).max(80),
      expiresAt: z.iso.datetime({ offset: true }).describe("at most 365 days ahead"),
    }).strict(),
    response: z.object({ token: Token, secret: z.string() }), status: 201, errors: [400, 401, 413, 415],
  }),
  revokeToken: defineRoute({
    method: "DELETE", path: "/tokens/{id}", tag: "tokens", auth: "user", summary: "Revoke a personal API token",
    params: z.object({ id: Id }), response: z.object({ token: Token }), errors: [400, 401, 404],
  }),

  // ---- workspaces ----------------------------------------------------------------
  listWorkspaces: defineRoute({
    method: "GET", path: "/workspaces", tag: "workspaces", auth: "user", summary: "The caller's workspaces",
    response: z.object({ items: z.array(Workspace) }), errors: [401],
  }),
  createWorkspace: defineRoute({
    method: "POST", path: "/workspaces", tag: "workspaces", auth: "user", summary: "Create a workspace; the caller becomes its owner",
    body: z.object({ name: Name, slug: Slug, settings: Json.optional() }).strict(),
    response: z.object({ workspace: Workspace }), status: 201, errors: [400, 401, 409, 413, 415],
  }),
  getWorkspace: defineRoute({
    method: "GET", path: "/workspaces/{ws}", tag: "workspaces", auth: "user", summary: "One workspace",
    params: WsParams, response: z.object({ workspace: Workspace }), errors: WS,
  }),
  updateWorkspace: defineRoute({
    method: "PATCH", path: "/workspaces/{ws}", tag: "workspaces", auth: "user", summary: "Rename or change settings (owner)",
    params: WsParams, body: z.object({ name: Name.optional(), settings: Json.optional() }).strict(),
    response: z.object({ workspace: Workspace }), errors: [...WS, 413, 415],
  }),
  listMembers: defineRoute({
    method: "GET", path: "/workspaces/{ws}/members", tag: "members", auth: "user", summary: "Members and their roles",
    params: WsParams, response: z.object({ items: z.array(Member) }), errors: WS,
  }),
  updateMember: defineRoute({
    method: "PATCH", path: "/workspaces/{ws}/members/{userId}", tag: "members", auth: "user", summary: "Change a member's role (owner)",
    params: WsParams.extend({ userId: Id }), body: z.object({ role: Role }).strict(),
    response: z.object({ member: Member }), errors: [...WS, 409, 413, 415],
  }),
  removeMember: defineRoute({
    method: "DELETE", path: "/workspaces/{ws}/members/{userId}", tag: "members", auth: "user", summary: "Remove a member (owner)",
    params: WsParams.extend({ userId: Id }), response: z.object({ ok: z.literal(true) }), errors: [...WS, 409],
  }),
  listInvitations: defineRoute({
    method: "GET", path: "/workspaces/{ws}/invitations", tag: "members", auth: "user", summary: "Invitations (owner)",
    params: WsParams, response: z.object({ items: z.array(Invitation) }), errors: WS,
  }),
  createInvitation: defineRoute({
    method: "POST", path: "/workspaces/{ws}/invitations", tag: "members", auth: "user", summary: "Invite by e-mail (owner)",
    params: WsParams, body: z.object({ email: Email, role: Role }).strict(),
    response: z.object({ invitation: Invitation }), status: 201, errors: [...WS, 409, 413, 415, 429],
    limits: ["invitationMail"],
  }),
  revokeInvitation: defineRoute({
    method: "DELETE", path: "/workspaces/{ws}/invitations/{id}", tag: "members", auth: "user", summary: "Cancel (revoke) an invitation (owner)",
    params: WsParams.extend({ id: Id }), response: z.object({ invitation: Invitation }), errors: [...WS, 409],
  }),
  resendInvitation: defineRoute({
    method: "POST", path: "/workspaces/{ws}/invitations/{id}/resend", tag: "members", auth: "user",
    summary: "Send an open or expired invitation again with a new link, valid for another 7 days; the earlier link stops working (owner)",
    params: WsParams.extend({ id: Id }), response: z.object({ invitation: Invitation }), errors: [...WS, 409, 429],
    limits: ["invitationMail"],
  }),
  listActivity: defineRoute({
    method: "GET", path: "/workspaces/{ws}/activity", tag: "members", auth: "user",
    summary: "Who changed which membership, invitation, family or design, and when; newest first, one page at a time (entries about invitations for owners only)",
    params: WsParams, query: z.object(Page),
    response: z.object({ items: z.array(ActivityEntry), nextCursor: z.string().nullable() }), errors: WS,
  }),
  acceptInvitation: defineRoute({
    method: "POST", path: "/invitations/accept", tag: "members", auth: "user",
    summary: "Accept an invitation with the secret from its mail (signed in with the invited address)",
    body: z.object({ token: z.string().min(10).max(200) }).strict(),
    response: z.object({ workspace: Workspace.omit({ settings: true }) }), errors: [400, 401, 403, 404, 409, 413, 415],
  }),

  // ---- families ------------------------------------------------------------------
  listFamilies: defineRoute({
    method: "GET", path: "/workspaces/{ws}/families", tag: "families", auth: "user", summary: "Built-in families and the workspace's own",
    params: WsParams, response: z.object({ items: z.array(Family) }), errors: WS,
  }),
  createFamily: defineRoute({
    method: "POST", path: "/workspaces/{ws}/families", tag: "families", auth: "user",
    summary: "Add a family of the workspace, empty or as a copy of another (owner); figures in data replace the copy's",
    params: WsParams,
    body: z.object({
      key: z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, "1–63 lower-case letters, digits or dashes, starting with a letter or digit"),
      name: Name,
      data: Json.optional().describe("figures (see the families' data), sources and gate types"),
      copyOf: Id.optional().describe("id of a family to copy (built-in or the workspace's own)"),
    }).strict(),
    response: z.object({ family: Family }), status: 201, errors: [...WS, 409, 413, 415],
  }),
  getFamily: defineRoute({
    method: "GET", path: "/workspaces/{ws}/families/{familyId}", tag: "families", auth: "user", summary: "One family",
    params: WsParams.extend({ familyId: Id }), response: z.object({ family: Family }), errors: WS,
  }),
  updateFamily: defineRoute({
    method: "PATCH", path: "/workspaces/{ws}/families/{familyId}", tag: "families", auth: "user",
    summary: "Change, archive or restore a family of the workspace (owner); revisions keep the snapshot they were saved with",
    params: WsParams.extend({ familyId: Id }), body: z.object({ name: Name.optional(), data: Json.optional(), archived: z.boolean().optional() }).strict(),
    response: z.object({ family: Family }), errors: [...WS, 409, 413, 415],
  }),
  familyMatrix: defineRoute({
    method: "GET", path: "/workspaces/{ws}/families/matrix", tag: "families", auth: "user",
    summary: "Driver → receiver compatibility of every pair of the workspace's families: noise margins, inputs fed per output in each state, verdict",
    params: WsParams, query: z.object({ archived: z.enum(["0", "1"]).optional().describe("1: include archived families") }),
    response: z.object({
      families: z.array(z.object({ id: z.string(), key: z.string(), name: z.string(), builtin: z.boolean(), archivedAt: z.string().nullable() })),
      pairs: z.array(CompatibilityPair),
    }),
    errors: WS,
  }),
  deleteFamily: defineRoute({
    method: "DELETE", path: "/workspaces/{ws}/families/{familyId}", tag: "families", auth: "user", summary: "Delete an unused family of the workspace (owner)",
    params: WsParams.extend({ familyId: Id }), response: z.object({ ok: z.literal(true) }), errors: [...WS, 409],
  }),

  // ---- designs and revisions -------------------------------------------------------
  listDesigns: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs", tag: "designs", auth: "user", summary: "Designs, searchable and sortable, one page at a time",
    params: WsParams,
    query: z.object({
      q: z.string().max(120).optional(),
      sort: z.enum(["name", "updated", "gates", "depth", "delay"]).optional(),
      order: z.enum(["asc", "desc"]).optional(),
      archived: z.enum(["0", "1"]).optional(),
      ...Page,
    }),
    response: z.object({ items: z.array(DesignSummary), nextCursor: z.string().nullable() }), errors: WS,
  }),
  createDesign: defineRoute({
    method: "POST", path: "/workspaces/{ws}/designs", tag: "designs", auth: "user", summary: "Create a design (designer, owner)",
    params: WsParams,
    body: z.object({
      name: Name,
      description: z.string().max(4000).optional(),
      familyId: Id,
      settings: CompileSettings.optional(),
      draftSource: Source.optional(),
    }).strict(),
    response: z.object({ design: DesignDetail }), status: 201, errors: [...WS, 409, 413, 415],
  }),
  importDesign: defineRoute({
    method: "POST", path: "/workspaces/{ws}/designs/import", tag: "designs", auth: "user",
    summary: "Create a design from a truth table (CSV) or a Verilog module (designer, owner); 422 import_refused with details.diagnostics when the text is refused, and nothing is created",
    params: WsParams,
    body: z.object({ ...ImportRequest, name: Name, description: z.string().max(4000).optional(), familyId: Id }).strict()
      .refine((b) => b.kind === "csv" || !b.outputs, { message: "outputs are for truth tables; a Verilog module declares its own", path: ["outputs"] }),
    response: z.object({ design: DesignDetail, diagnostics: z.array(ImportDiagnostic) }),
    status: 201, maxBodyBytes: IMPORT_BODY_BYTES, errors: [...WS, 409, 413, 415, 422],
    limits: ["compile"],
  }),
  getDesign: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}", tag: "designs", auth: "user", summary: "One design with its draft",
    params: DesignParams, response: z.object({ design: DesignDetail }), errors: WS,
  }),
  updateDesign: defineRoute({
    method: "PATCH", path: "/workspaces/{ws}/designs/{designId}", tag: "designs", auth: "user",
    summary: "Rename, describe, archive or restore a design (designer, owner); the draft is written with PUT …/draft",
    params: DesignParams,
    body: z.object({
      name: Name.optional(),
      description: z.string().max(4000).optional(),
      archived: z.boolean().optional(),
    }).strict(),
    response: z.object({ design: DesignDetail }), errors: [...WS, 409, 413, 415],
  }),
  saveDraft: defineRoute({
    method: "PUT", path: "/workspaces/{ws}/designs/{designId}/draft", tag: "designs", auth: "user",
    summary: "Write the design's draft (source, family, settings) if it is still at baseVersion (designer, owner); 409 with details.draft when someone wrote it since",
    params: DesignParams,
    body: z.object({
      source: Source,
      familyId: Id,
      settings: CompileSettings,
      baseVersion: z.number().int().min(1).describe("the draftVersion your text started from"),
    }).strict(),
    response: z.object({ design: DesignDetail }),
    errors: [...WS, 409, 413, 415],
  }),
  listRevisions: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/revisions", tag: "revisions", auth: "user", summary: "Revisions, newest first",
    params: DesignParams, query: z.object(Page),
    response: z.object({ items: z.array(RevisionSummary), nextCursor: z.string().nullable() }), errors: WS,
  }),
  createRevision: defineRoute({
    method: "POST", path: "/workspaces/{ws}/designs/{designId}/revisions", tag: "revisions", auth: "user",
    summary: "Compile and save a revision (designer, owner); the server computes the stored figures",
    params: DesignParams,
    body: z.object({
      message: z.string().trim().min(1).max(2000),
      source: Source,
      familyId: Id,
      settings: CompileSettings,
      draftVersion: z.number().int().min(1).optional().describe("the draft version the source came from: the draft follows the revision only if it is still there"),
    }).strict(),
    response: z.object({ revision: RevisionDetail }), status: 201, errors: [...WS, 413, 415, 422, 429],
    limits: ["compile"],
  }),
  getRevision: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/revisions/{number}", tag: "revisions", auth: "user", summary: "One revision",
    params: RevisionParams, response: z.object({ revision: RevisionDetail }), errors: WS,
  }),
  exportRevision: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/revisions/{number}/export", tag: "revisions", auth: "user",
    summary: "The revision's netlist as a file: Verilog (IEEE 1364), VHDL (IEEE 1076), CSV or JSON",
    params: RevisionParams, query: z.object({ format: z.enum(["verilog", "vhdl", "csv", "json"]) }),
    produces: "text/plain", errors: [...WS, 422, 429],
    limits: ["export"],
  }),

  revisionTable: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/revisions/{number}/table", tag: "revisions", auth: "user",
    summary: "The revision's truth table: format=csv, the whole table as a file (up to 16 inputs), in the layout the import reads; format=json, one page of rows (offset, limit up to 1024)",
    params: RevisionParams,
    query: z.object({
      format: z.enum(["csv", "json"]).default("json"),
      offset: z.coerce.number().int().min(0).optional(),
      limit: z.coerce.number().int().min(1).max(1024).optional(),
    }),
    produces: "text/csv", errors: [...WS, 422],
  }),

  // ---- import --------------------------------------------------------------------
  importPreview: defineRoute({
    method: "POST", path: "/import", tag: "import", auth: "user",
    summary: "Turn a truth table (CSV) or a Verilog module into a design source without saving anything: the source, or the located reasons it was refused",
    body: z.object(ImportRequest).strict()
      .refine((b) => b.kind === "csv" || !b.outputs, { message: "outputs are for truth tables; a Verilog module declares its own", path: ["outputs"] }),
    response: ImportOutcome, maxBodyBytes: IMPORT_BODY_BYTES, errors: [...R, 400, 413, 415],
    limits: ["compile"],
  }),

  // ---- comparing and reviewing ------------------------------------------------------
  compareRevisions: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/compare", tag: "reviews", auth: "user",
    summary: "Two revisions side by side, from their stored figures and netlists: signed deltas (to − from), the source as a line diff, gates added and removed by type and width. Defaults: to the latest, from the one before",
    params: DesignParams,
    query: z.object({ from: z.coerce.number().int().positive().optional(), to: z.coerce.number().int().positive().optional() }),
    response: z.object({
      from: RevisionSide,
      to: RevisionSide,
      comparison: Comparison,
      source: SourceDiff,
    }),
    errors: WS,
  }),
  compareDraft: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/draft/compare", tag: "reviews", auth: "user",
    summary: "The unsaved draft (source, family and settings as last written) against a revision: the revision's stored figures, the draft's from compiling it on the server's compile path. Default: from the latest revision. 422 with the diagnostics when the draft has errors",
    params: DesignParams,
    query: z.object({ from: z.coerce.number().int().positive().optional() }),
    response: z.object({
      from: RevisionSide,
      to: z.object({
        draft: z.object({ version: z.number(), updatedAt: z.string().nullable(), updatedBy: Ref.nullable() }),
        figures: Figures,
        source: z.string(),
        netlist: Json.describe("the JSON netlist document of the draft's run"),
        critical: z.object({ nets: z.array(z.string()), gates: z.array(z.string()) }),
      }),
      comparison: Comparison,
      source: SourceDiff,
    }),
    errors: [...WS, 422, 429],
    limits: ["compile"],
  }),
  revisionFigures: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/revisions/{number}/figures", tag: "reviews", auth: "user",
    summary: "One revision's stored figures, source, netlist and critical path (one side of a comparison, e.g. against the unsaved draft)",
    params: RevisionParams, response: z.object({ side: RevisionSide }), errors: WS,
  }),
  listDesignReviews: defineRoute({
    method: "GET", path: "/workspaces/{ws}/designs/{designId}/reviews", tag: "reviews", auth: "user", summary: "A design's reviews, newest first",
    params: DesignParams, response: z.object({ items: z.array(ReviewSummary) }), errors: WS,
  }),
  requestReview: defineRoute({
    method: "POST", path: "/workspaces/{ws}/designs/{designId}/reviews", tag: "reviews", auth: "user",
    summary: "Ask members who may approve (reviewers, owners; not the revision's author) to review a revision (designer, owner); each gets an e-mail. Open reviews of earlier revisions become superseded",
    params: DesignParams,
    body: z.object({
      revision: z.number().int().positive(),
      reviewers: z.array(Id).min(1, "name at least one member").max(20),
      message: ReviewText.optional(),
    }).strict(),
    response: z.object({ review: ReviewDetail, mailFailed: z.array(z.string()).describe("addresses the mail could not reach; the review stands") }),
    status: 201, limits: ["review"], errors: [...WS, 409, 413, 415, 429],
  }),
  reviewInbox: defineRoute({
    method: "GET", path: "/workspaces/{ws}/reviews", tag: "reviews", auth: "user",
    summary: "Reviews waiting for the caller, reviews the caller asked for, and the workspace's recent decisions",
    params: WsParams,
    response: z.object({ waitingForMe: z.array(ReviewSummary), askedByMe: z.array(ReviewSummary), recentDecisions: z.array(Decision) }),
    errors: WS,
  }),
  getReview: defineRoute({
    method: "GET", path: "/workspaces/{ws}/reviews/{reviewId}", tag: "reviews", auth: "user", summary: "One review with its comments and decisions",
    params: ReviewParams, response: z.object({ review: ReviewDetail }), errors: WS,
  }),
  addReviewComment: defineRoute({
    method: "POST", path: "/workspaces/{ws}/reviews/{reviewId}/comments", tag: "reviews", auth: "user",
    summary: "Comment on a review, generally or on a line of the reviewed revision's source (reviewer, designer, owner)",
    params: ReviewParams,
    body: z.object({ body: ReviewText, line: z.number().int().positive().nullable().optional() }).strict(),
    response: z.object({ review: ReviewDetail }), status: 201, limits: ["review"], errors: [...WS, 413, 415, 429],
  }),
  decideReview: defineRoute({
    method: "POST", path: "/workspaces/{ws}/reviews/{reviewId}/decisions", tag: "reviews", auth: "user",
    summary: "Approve, or ask for changes with a note (a member asked to review; never the revision's author). Decisions are history and cannot be changed",
    params: ReviewParams,
    body: z.object({ verdict: z.enum(["approved", "changes-asked"]), note: ReviewText.optional() }).strict(),
    response: z.object({ review: ReviewDetail }), status: 201, limits: ["review"], errors: [...WS, 409, 413, 415, 429],
  }),
  withdrawReview: defineRoute({
    method: "POST", path: "/workspaces/{ws}/reviews/{reviewId}/withdraw", tag: "reviews", auth: "user",
    summary: "Withdraw an open review (the member who asked, or an owner)",
    params: ReviewParams, body: z.object({ note: ReviewText.optional() }).strict(),
    response: z.object({ review: ReviewDetail }), limits: ["review"], errors: [...WS, 409, 413, 415, 429],
  }),

  // ---- compile -------------------------------------------------------------------
  compile: defineRoute({
    method: "POST", path: "/compile", tag: "compile", auth: "user",
    summary: "Compile a source: diagnostics, minimized covers, netlist and figures (built-in families for anyone signed in; a workspace family needs membership)",
    body: z.object({
      source: Source,
      settings: CompileSettings.default({}),
      workspace: Slug.optional(),
      familyId: Id.optional(),
      familyKey: z.string().max(64).optional(),
    }).strict().refine((b) => b.familyId || b.familyKey, { message: "give familyId or familyKey", path: ["familyId"] }),
    response: CompileResponse,
    errors: [...R, 400, 404, 413, 415, 422],
    limits: ["compile"],
  }),
  // ---- libraries -------------------------------------------------------------------
  listLibraries: defineRoute({
    method: "GET", path: "/workspaces/{ws}/libraries", tag: "libraries", auth: "user",
    summary: "The libraries this workspace may use (its own, then those shared with it), with their blocks and revisions",
    params: WsParams, response: z.object({ items: z.array(Library) }), errors: WS,
  }),
  createLibrary: defineRoute({
    method: "POST", path: "/workspaces/{ws}/libraries", tag: "libraries", auth: "user", summary: "Create a library (designer, owner)",
    params: WsParams,
    body: z.object({ key: LibraryKey, name: Name, description: z.string().max(4000).optional() }).strict(),
    response: z.object({ library: LibraryDetail }), status: 201, errors: [...WS, 409, 413, 415],
  }),
  getLibrary: defineRoute({
    method: "GET", path: "/workspaces/{ws}/libraries/{libraryId}", tag: "libraries", auth: "user",
    summary: "One library: its blocks, every revision with its figures and state, where each is used in this workspace, and its shares",
    params: LibraryParams, response: z.object({ library: LibraryDetail }), errors: WS,
  }),
  publishBlock: defineRoute({
    method: "POST", path: "/workspaces/{ws}/libraries/{libraryId}/blocks/{block}/revisions", tag: "libraries", auth: "user",
    summary: "Publish a block's source as its next revision (designer, owner of the library's workspace); the server compiles it under the family given and keeps its figures and verification; 422 with the diagnostics when it does not compile as a block",
    params: LibraryParams.extend({ block: BlockName }),
    body: z.object({
      source: Source.describe("a design of its own: inputs, outputs, equations, never lines; no use lines and no dc(...)"),
      familyId: Id,
      settings: CompileSettings.default({}),
      message: z.string().trim().min(1).max(2000),
    }).strict(),
    response: z.object({ revision: LibraryRevision.extend({ block: z.string(), library: z.string() }) }),
    status: 201, errors: [...WS, 413, 415, 422, 429],
    limits: ["compile"],
  }),
  getLibraryRevision: defineRoute({
    method: "GET", path: "/workspaces/{ws}/libraries/{libraryId}/blocks/{block}/revisions/{number}", tag: "libraries", auth: "user",
    summary: "One block revision with its source",
    params: LibraryParams.extend({ block: BlockName, number: z.coerce.number().int().positive() }),
    response: z.object({
      revision: LibraryRevision.extend({ block: z.string(), library: z.string(), source: z.string(), settings: Json, verification: Json.nullable() }),
    }),
    errors: WS,
  }),
  approveLibraryRevision: defineRoute({
    method: "POST", path: "/workspaces/{ws}/libraries/{libraryId}/blocks/{block}/revisions/{number}/approval", tag: "libraries", auth: "user",
    summary: "Approve a block revision published while the workspace asks for an approved review first (reviewer, owner of the library's workspace; never its author); from then on designs may use it and it is the block's latest. 409 when it needed no review or is approved already",
    params: LibraryParams.extend({ block: BlockName, number: z.coerce.number().int().positive() }),
    body: z.object({ note: z.string().trim().max(2000).optional().describe("what was checked") }).strict(),
    response: z.object({ revision: LibraryRevision.extend({ block: z.string(), library: z.string() }) }),
    status: 201, errors: [...WS, 409, 413, 415, 429],
    limits: ["review"],
  }),
  shareLibrary: defineRoute({
    method: "POST", path: "/workspaces/{ws}/libraries/{libraryId}/shares", tag: "libraries", auth: "user",
    summary: "Share a library read-only with another workspace, named by its slug (owner); its members may use it and never publish to it",
    params: LibraryParams, body: z.object({ workspace: Slug }).strict(),
    response: z.object({ library: LibraryDetail }), status: 201, errors: [...WS, 409, 413, 415],
  }),
  unshareLibrary: defineRoute({
    method: "DELETE", path: "/workspaces/{ws}/libraries/{libraryId}/shares/{workspace}", tag: "libraries", auth: "user",
    summary: "End a share (owner); the other workspace's saved revisions keep what they pinned",
    params: LibraryParams.extend({ workspace: Slug }), response: z.object({ library: LibraryDetail }), errors: WS,
  }),
  resolveUses: defineRoute({
    method: "POST", path: "/workspaces/{ws}/libraries/resolve", tag: "libraries", auth: "user",
    summary: "Answer use lines as this workspace's compiles would: each block revision's source and ports, or why it cannot be used (for clients that compile on their own, such as the CLI)",
    params: WsParams, body: z.object({ uses: z.array(UseRequest).max(200) }).strict(),
    response: z.object({
      items: z.array(z.union([
        UseRequest.extend({ ok: z.literal(true), source: z.string(), number: z.number(), latest: z.number(), inputs: z.array(z.string()), outputs: z.array(z.string()), stats: Json }),
        UseRequest.extend({ ok: z.literal(false), message: z.string() }),
      ])),
    }),
    errors: [...WS, 413, 415, 429],
    limits: ["compile"],
  }),

  // ---- compile jobs (long runs) ------------------------------------------------------
  createJob: defineRoute({
    method: "POST", path: "/workspaces/{ws}/jobs", tag: "jobs", auth: "user",
    summary: "Run a compile to the end as a background job (any member); answers at once with the job to follow",
    params: WsParams,
    body: z.object({ source: Source, familyId: Id, settings: CompileSettings.default({}), designId: Id.optional() }).strict(),
    response: z.object({ job: Job }), status: 202, errors: [...WS, 413, 415, 422, 429],
    limits: ["compile"],
  }),
  listJobs: defineRoute({
    method: "GET", path: "/workspaces/{ws}/jobs", tag: "jobs", auth: "user", summary: "The workspace's latest compile jobs, newest first",
    params: WsParams, query: z.object({ mine: z.enum(["0", "1"]).optional(), limit: z.coerce.number().int().min(1).max(100).optional() }),
    response: z.object({ items: z.array(Job) }), errors: WS,
  }),
  getJob: defineRoute({
    method: "GET", path: "/workspaces/{ws}/jobs/{jobId}", tag: "jobs", auth: "user",
    summary: "One compile job: where it stands (stage, best cost, proven lower bound) and, once done, its result",
    params: WsParams.extend({ jobId: Id }), response: z.object({ job: Job }), errors: WS,
  }),
  cancelJob: defineRoute({
    method: "DELETE", path: "/workspaces/{ws}/jobs/{jobId}", tag: "jobs", auth: "user",
    summary: "Stop a compile job (whoever filed it, or an owner)",
    params: WsParams.extend({ jobId: Id }), response: z.object({ job: Job }), errors: WS,
  }),
  openapi: defineRoute({
    method: "GET", path: "/openapi.json", tag: "meta", auth: "none", summary: "This document",
    response: Json, errors: [],
  }),
};

/**
 * Limits of next-auth's credential sign-ins (app/api/auth/[...nextauth]), which
 * do not go through `handle` but are counted by the same enforceLimits.
 */
export const signInLimits: Record<"password" | "email-link", readonly LimitName[]> = {
  password: ["signInAccount", "signInCaller"],
  "email-link": ["signInCaller", "mailSecret"],
};
