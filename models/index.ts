/**
 * Sequelize class models. `initModels(sequelize)` binds them to a connection;
 * the schema itself comes from migrations/, never from sync().
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export const ROLES = ["owner", "designer", "reviewer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare emailVerifiedAt: Date | null;
  /** Raised to end every session: a session's JWT carries the version it was signed in with. */
  declare sessionVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Workspace extends Model<InferAttributes<Workspace>, InferCreationAttributes<Workspace>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare slug: string;
  declare settings: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  declare userId: ForeignKey<User["id"]>;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class LogicFamilyRecord extends Model<
  InferAttributes<LogicFamilyRecord>,
  InferCreationAttributes<LogicFamilyRecord>
> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]> | null;
  declare key: string;
  declare name: string;
  declare builtin: CreationOptional<boolean>;
  declare data: Record<string, unknown>;
  /** Set when an owner archives the family: kept for what used it, not offered for new designs. */
  declare archivedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Design extends Model<InferAttributes<Design>, InferCreationAttributes<Design>> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  declare name: string;
  declare description: CreationOptional<string>;
  declare familyId: ForeignKey<LogicFamilyRecord["id"]>;
  declare settings: CreationOptional<Record<string, unknown>>;
  declare draftSource: CreationOptional<string>;
  /** Bumped by every write of the draft (source, family or settings); a write names the version it started from. */
  declare draftVersion: CreationOptional<number>;
  declare draftUpdatedAt: CreationOptional<Date | null>;
  declare draftUpdatedBy: CreationOptional<ForeignKey<User["id"]> | null>;
  declare createdBy: ForeignKey<User["id"]>;
  declare archivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Revision extends Model<InferAttributes<Revision>, InferCreationAttributes<Revision>> {
  declare id: CreationOptional<string>;
  declare designId: ForeignKey<Design["id"]>;
  declare number: number;
  declare source: string;
  declare familyId: ForeignKey<LogicFamilyRecord["id"]>;
  declare familySnapshot: Record<string, unknown>;
  declare settings: Record<string, unknown>;
  declare stats: Record<string, unknown>;
  /** The netlist saved with the revision ({ model, document, analysis summary }); null for rows from before it was kept. */
  declare netlist: CreationOptional<Record<string, unknown> | null>;
  declare authorId: ForeignKey<User["id"]>;
  declare message: string;
  declare createdAt: CreationOptional<Date>;
}

export const REVIEW_STATES = ["open", "approved", "changes-asked", "withdrawn", "superseded"] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];
export const REVIEW_VERDICTS = ["approved", "changes-asked", "withdrawn", "superseded"] as const;
export type ReviewVerdict = (typeof REVIEW_VERDICTS)[number];

/** A request to review one revision; only its state changes, once, out of "open". */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<string>;
  declare designId: ForeignKey<Design["id"]>;
  declare revisionId: ForeignKey<Revision["id"]>;
  declare requestedBy: ForeignKey<User["id"]>;
  declare message: CreationOptional<string>;
  declare state: CreationOptional<ReviewState>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** A member asked to review. */
export class ReviewReviewer extends Model<InferAttributes<ReviewReviewer>, InferCreationAttributes<ReviewReviewer>> {
  declare id: CreationOptional<string>;
  declare reviewId: ForeignKey<Review["id"]>;
  declare userId: ForeignKey<User["id"]>;
  declare createdAt: CreationOptional<Date>;
}

/** A comment in a review's thread: general, or on a line of the reviewed revision's source. */
export class ReviewComment extends Model<InferAttributes<ReviewComment>, InferCreationAttributes<ReviewComment>> {
  declare id: CreationOptional<string>;
  declare reviewId: ForeignKey<Review["id"]>;
  declare authorId: ForeignKey<User["id"]>;
  declare body: string;
  declare line: number | null;
  declare createdAt: CreationOptional<Date>;
}

/** Who decided what on which revision, and when: history, never changed. */
export class ReviewDecision extends Model<InferAttributes<ReviewDecision>, InferCreationAttributes<ReviewDecision>> {
  declare id: CreationOptional<string>;
  declare reviewId: ForeignKey<Review["id"]>;
  declare revisionId: ForeignKey<Revision["id"]>;
  declare userId: ForeignKey<User["id"]>;
  declare verdict: ReviewVerdict;
  declare note: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
}

/** A named shelf of blocks in a workspace; use lines write its key (or "slug/key" from a workspace it is shared with). */
export class Library extends Model<InferAttributes<Library>, InferCreationAttributes<Library>> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  declare key: string;
  declare name: string;
  declare description: CreationOptional<string>;
  declare createdBy: ForeignKey<User["id"]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class LibraryBlock extends Model<InferAttributes<LibraryBlock>, InferCreationAttributes<LibraryBlock>> {
  declare id: CreationOptional<string>;
  declare libraryId: ForeignKey<Library["id"]>;
  declare name: string;
  declare createdAt: CreationOptional<Date>;
}

/** One published revision of a block: immutable (model hooks, table rights and triggers). */
export class LibraryRevision extends Model<InferAttributes<LibraryRevision>, InferCreationAttributes<LibraryRevision>> {
  declare id: CreationOptional<string>;
  declare blockId: ForeignKey<LibraryBlock["id"]>;
  declare number: number;
  declare source: string;
  declare message: string;
  declare inputs: string[];
  declare outputs: string[];
  declare familyId: ForeignKey<LogicFamilyRecord["id"]>;
  declare familySnapshot: Record<string, unknown>;
  declare settings: Record<string, unknown>;
  declare stats: Record<string, unknown>;
  declare verification: Record<string, unknown> | null;
  declare authorId: ForeignKey<User["id"]>;
  /** Published while the workspace asked for an approved review first; it counts once a LibraryApproval exists. */
  declare needsReview: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
}

/** The approval that lets a revision published under review count (immutable). */
export class LibraryApproval extends Model<InferAttributes<LibraryApproval>, InferCreationAttributes<LibraryApproval>> {
  declare id: CreationOptional<string>;
  declare libraryRevisionId: ForeignKey<LibraryRevision["id"]>;
  declare reviewId: string | null;
  declare approvedBy: ForeignKey<User["id"]>;
  declare note: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
}

/** Read-only use of a library by another workspace. */
export class LibraryShare extends Model<InferAttributes<LibraryShare>, InferCreationAttributes<LibraryShare>> {
  declare id: CreationOptional<string>;
  declare libraryId: ForeignKey<Library["id"]>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  declare createdBy: ForeignKey<User["id"]>;
  declare createdAt: CreationOptional<Date>;
}

/** A library revision a saved design revision used (immutable, like the revision). */
export class RevisionLibrary extends Model<InferAttributes<RevisionLibrary>, InferCreationAttributes<RevisionLibrary>> {
  declare id: CreationOptional<string>;
  declare revisionId: ForeignKey<Revision["id"]>;
  declare libraryRevisionId: ForeignKey<LibraryRevision["id"]>;
  declare library: string;
  declare block: string;
  declare createdAt: CreationOptional<Date>;
}

const uuid = { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 };

/** Model hooks that refuse changes to a record table; the database triggers are the authority, these say it first. */
function recordHooks(what: string) {
  const change = () => {
    throw new Error(`${what} are immutable: add a new one instead`);
  };
  const remove = () => {
    throw new Error(`${what} are immutable: they cannot be deleted`);
  };
  return { beforeUpdate: change, beforeBulkUpdate: change, beforeDestroy: remove, beforeBulkDestroy: remove };
}
const json = (allowNull = false) => ({ type: DataTypes.JSONB, allowNull });

/** Binds every model to the connection and declares the associations. */
export function initModels(sequelize: Sequelize) {
  const base = { sequelize, underscored: true, timestamps: true } as const;

  User.init(
    {
      id: uuid,
      email: { type: DataTypes.STRING(254), allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      passwordHash: { type: DataTypes.STRING(200), allowNull: true },
      emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
      sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "users" },
  );
  Workspace.init(
    {
      id: uuid,
      name: { type: DataTypes.STRING(120), allowNull: false },
      slug: { type: DataTypes.STRING(64), allowNull: false },
      settings: { ...json(), defaultValue: {} },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "workspaces" },
  );
  Membership.init(
    {
      id: uuid,
      role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "memberships" },
  );
  LogicFamilyRecord.init(
    {
      id: uuid,
      key: { type: DataTypes.STRING(64), allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      builtin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      data: json(),
      archivedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "logic_families" },
  );
  Design.init(
    {
      id: uuid,
      name: { type: DataTypes.STRING(120), allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      settings: { ...json(), defaultValue: {} },
      draftSource: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      draftVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      draftUpdatedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      draftUpdatedBy: { type: DataTypes.UUID, allowNull: true, defaultValue: null },
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "designs" },
  );
  Revision.init(
    {
      id: uuid,
      number: { type: DataTypes.INTEGER, allowNull: false },
      source: { type: DataTypes.TEXT, allowNull: false },
      familySnapshot: json(),
      settings: json(),
      stats: json(),
      netlist: { ...json(true), defaultValue: null },
      message: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
    },
    {
      ...base,
      tableName: "revisions",
      updatedAt: false,
      hooks: {
        // The database trigger is the authority; these give a clearer error first.
        beforeUpdate: () => {
          throw new Error("revisions are immutable: save a new revision instead");
        },
        beforeDestroy: () => {
          throw new Error("revisions are immutable: they cannot be deleted");
        },
        beforeBulkUpdate: () => {
          throw new Error("revisions are immutable: save a new revision instead");
        },
        beforeBulkDestroy: () => {
          throw new Error("revisions are immutable: they cannot be deleted");
        },
      },
    },
  );

  Workspace.hasMany(Membership, { foreignKey: "workspaceId", as: "memberships" });
  Membership.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });
  Workspace.hasMany(LogicFamilyRecord, { foreignKey: "workspaceId", as: "families" });
  LogicFamilyRecord.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  Workspace.hasMany(Design, { foreignKey: "workspaceId", as: "designs" });
  Design.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  Design.belongsTo(LogicFamilyRecord, { foreignKey: "familyId", as: "family" });
  Design.belongsTo(User, { foreignKey: "createdBy", as: "creator" });
  Design.hasMany(Revision, { foreignKey: "designId", as: "revisions" });
  Revision.belongsTo(Design, { foreignKey: "designId", as: "design" });
  Revision.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Revision.belongsTo(LogicFamilyRecord, { foreignKey: "familyId", as: "family" });

  EmailToken.init(
    {
      id: uuid,
      purpose: { type: DataTypes.STRING(16), allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "email_tokens", updatedAt: false },
  );
  Invitation.init(
    {
      id: uuid,
      email: { type: DataTypes.STRING(254), allowNull: false },
      role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "invitations" },
  );
  ApiToken.init(
    {
      id: uuid,
      name: { type: DataTypes.STRING(80), allowNull: false },
      prefix: { type: DataTypes.STRING(16), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "api_tokens", updatedAt: false },
  );
  Invitation.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  Invitation.belongsTo(User, { foreignKey: "invitedBy", as: "inviter" });
  ApiToken.belongsTo(User, { foreignKey: "userId", as: "user" });

  // The database triggers are the authority on review history; these hooks say so first.
  const history = (what: string) => ({
    beforeUpdate: () => {
      throw new Error(`${what} are history: they cannot be changed`);
    },
    beforeDestroy: () => {
      throw new Error(`${what} are history: they cannot be deleted`);
    },
    beforeBulkUpdate: () => {
      throw new Error(`${what} are history: they cannot be changed`);
    },
    beforeBulkDestroy: () => {
      throw new Error(`${what} are history: they cannot be deleted`);
    },
  });
  Review.init(
    {
      id: uuid,
      message: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      state: { type: DataTypes.ENUM(...REVIEW_STATES), allowNull: false, defaultValue: "open" },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "reviews" },
  );
  ReviewReviewer.init(
    { id: uuid, createdAt: DataTypes.DATE },
    { ...base, tableName: "review_reviewers", updatedAt: false, hooks: history("the reviewers asked") },
  );
  ReviewComment.init(
    {
      id: uuid,
      body: { type: DataTypes.TEXT, allowNull: false },
      line: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "review_comments", updatedAt: false, hooks: history("review comments") },
  );
  ReviewDecision.init(
    {
      id: uuid,
      verdict: { type: DataTypes.ENUM(...REVIEW_VERDICTS), allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "review_decisions", updatedAt: false, hooks: history("review decisions") },
  );
  Review.belongsTo(Design, { foreignKey: "designId", as: "design" });
  Review.belongsTo(Revision, { foreignKey: "revisionId", as: "revision" });
  Review.belongsTo(User, { foreignKey: "requestedBy", as: "requester" });
  Review.hasMany(ReviewReviewer, { foreignKey: "reviewId", as: "reviewers" });
  Review.hasMany(ReviewComment, { foreignKey: "reviewId", as: "comments" });
  Review.hasMany(ReviewDecision, { foreignKey: "reviewId", as: "decisions" });
  ReviewReviewer.belongsTo(User, { foreignKey: "userId", as: "user" });
  ReviewComment.belongsTo(User, { foreignKey: "authorId", as: "author" });
  ReviewDecision.belongsTo(User, { foreignKey: "userId", as: "user" });
  ReviewDecision.belongsTo(Revision, { foreignKey: "revisionId", as: "revision" });

  const appendOnly = (what: string) => () => {
    throw new Error(`activity is append-only: an entry cannot be ${what}`);
  };
  Activity.init(
    {
      id: uuid,
      action: { type: DataTypes.STRING(40), allowNull: false },
      subjectKind: { type: DataTypes.STRING(16), allowNull: false },
      subjectId: { type: DataTypes.STRING(64), allowNull: true },
      subjectLabel: { type: DataTypes.STRING(254), allowNull: false, defaultValue: "" },
      details: { ...json(), defaultValue: {} },
      createdAt: DataTypes.DATE,
    },
    {
      ...base,
      tableName: "activity",
      updatedAt: false,
      hooks: {
        // The database trigger is the authority; these give a clearer error first.
        beforeUpdate: appendOnly("changed"),
        beforeDestroy: appendOnly("deleted"),
        beforeBulkUpdate: appendOnly("changed"),
        beforeBulkDestroy: appendOnly("deleted"),
      },
    },
  );
  Activity.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  Activity.belongsTo(User, { foreignKey: "actorId", as: "actor" });

  Library.init(
    {
      id: uuid,
      key: { type: DataTypes.STRING(64), allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { ...base, tableName: "libraries" },
  );
  LibraryBlock.init(
    { id: uuid, name: { type: DataTypes.STRING(64), allowNull: false }, createdAt: DataTypes.DATE },
    { ...base, tableName: "library_blocks", updatedAt: false },
  );
  LibraryRevision.init(
    {
      id: uuid,
      number: { type: DataTypes.INTEGER, allowNull: false },
      source: { type: DataTypes.TEXT, allowNull: false },
      message: { type: DataTypes.TEXT, allowNull: false },
      inputs: json(),
      outputs: json(),
      familySnapshot: json(),
      settings: json(),
      stats: json(),
      verification: json(true),
      needsReview: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "library_revisions", updatedAt: false, hooks: recordHooks("library revisions") },
  );
  LibraryApproval.init(
    {
      id: uuid,
      reviewId: { type: DataTypes.UUID, allowNull: true },
      note: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "library_approvals", updatedAt: false, hooks: recordHooks("library approvals") },
  );
  LibraryShare.init(
    { id: uuid, createdAt: DataTypes.DATE },
    { ...base, tableName: "library_shares", updatedAt: false },
  );
  RevisionLibrary.init(
    {
      id: uuid,
      library: { type: DataTypes.STRING(200), allowNull: false },
      block: { type: DataTypes.STRING(64), allowNull: false },
      createdAt: DataTypes.DATE,
    },
    { ...base, tableName: "revision_libraries", updatedAt: false, hooks: recordHooks("the library revisions a revision used") },
  );
  Library.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  Library.belongsTo(User, { foreignKey: "createdBy", as: "creator" });
  Library.hasMany(LibraryBlock, { foreignKey: "libraryId", as: "blocks" });
  LibraryBlock.belongsTo(Library, { foreignKey: "libraryId", as: "library" });
  LibraryBlock.hasMany(LibraryRevision, { foreignKey: "blockId", as: "revisions" });
  LibraryRevision.belongsTo(LibraryBlock, { foreignKey: "blockId", as: "block" });
  LibraryRevision.belongsTo(User, { foreignKey: "authorId", as: "author" });
  LibraryRevision.belongsTo(LogicFamilyRecord, { foreignKey: "familyId", as: "family" });
  LibraryApproval.belongsTo(LibraryRevision, { foreignKey: "libraryRevisionId", as: "libraryRevision" });
  LibraryApproval.belongsTo(User, { foreignKey: "approvedBy", as: "approver" });
  LibraryShare.belongsTo(Library, { foreignKey: "libraryId", as: "library" });
  LibraryShare.belongsTo(Workspace, { foreignKey: "workspaceId", as: "workspace" });
  LibraryShare.belongsTo(User, { foreignKey: "createdBy", as: "creator" });
  RevisionLibrary.belongsTo(Revision, { foreignKey: "revisionId", as: "revision" });
  RevisionLibrary.belongsTo(LibraryRevision, { foreignKey: "libraryRevisionId", as: "libraryRevision" });

  return {
    User, Workspace, Membership, LogicFamilyRecord, Design, Revision, EmailToken, Invitation, ApiToken,
    Review, ReviewReviewer, ReviewComment, ReviewDecision, Activity,
    Library, LibraryBlock, LibraryRevision, LibraryApproval, LibraryShare, RevisionLibrary,
  };
}

export class EmailToken extends Model<InferAttributes<EmailToken>, InferCreationAttributes<EmailToken>> {
  declare id: CreationOptional<string>;
  declare purpose: "signin" | "reset" | "verify";
  declare email: string;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedBy: ForeignKey<User["id"]>;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User["id"]>;
  declare name: string;
  declare prefix: string;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare lastUsedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}

export const ACTIVITY_KINDS = ["membership", "invitation", "family", "design", "library"] as const;
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];

/** One entry of a workspace's activity list; rows are never changed or deleted (a trigger refuses it). */
export class Activity extends Model<InferAttributes<Activity>, InferCreationAttributes<Activity>> {
  declare id: CreationOptional<string>;
  declare workspaceId: ForeignKey<Workspace["id"]>;
  /** Who did it; null for changes made by the system (the demo seed). */
  declare actorId: ForeignKey<User["id"]> | null;
  /** What happened, e.g. "member.role", "invitation.create", "family.archive", "design.rename". */
  declare action: string;
  declare subjectKind: ActivityKind;
  declare subjectId: string | null;
  /** The subject's name or e-mail when it happened, so the entry reads well after a rename. */
  declare subjectLabel: CreationOptional<string>;
  declare details: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
}
