/** Shapes the REST API answers with, as the pages use them. */
import type { Role } from "../../models";

export type { Role };

export interface WorkspaceInfo {
  id: string;
  slug: string;
  name: string;
  role: Role;
  settings?: Record<string, unknown>;
}

export interface Person {
  id: string;
  name: string;
}

export interface FamilyRef {
  id: string;
  key: string;
  name: string;
}

export interface FamilyItem extends FamilyRef {
  builtin: boolean;
  fanIn: number;
  fanOut: number;
  data: Record<string, unknown>;
  /** Set when an owner archived it: not offered for new designs. */
  archivedAt: string | null;
}

export interface MemberItem {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: string;
}

export interface InvitationItem {
  id: string;
  email: string;
  role: Role;
  status: "open" | "accepted" | "revoked" | "expired";
  expiresAt: string;
  createdAt: string;
  invitedBy: Person;
}

export interface ActivityItem {
  id: string;
  at: string;
  actor: Person | null;
  action: string;
  subject: { kind: string; id: string | null; label: string };
  details: Record<string, unknown>;
  summary: string;
}

/** Figures stored with each revision (computed by the server's pipeline). */
export interface RevisionStats {
  gates?: number;
  depth?: number;
  delayNs?: number | null;
  staticMw?: number | null;
  dynamicMw?: number | null;
  products?: number;
  literals?: number;
  exact?: boolean;
  packages?: number | Record<string, number>;
  transistors?: number | null;
  [key: string]: unknown;
}

export interface RevisionSummary {
  id: string;
  number: number;
  message: string;
  author: Person;
  createdAt: string;
  stats: RevisionStats;
  family?: FamilyRef;
}

export interface DesignItem {
  id: string;
  name: string;
  description: string;
  family: FamilyRef;
  latestRevision: (Omit<RevisionSummary, "id" | "family"> & { id?: string }) | null;
  updatedAt: string;
  archivedAt: string | null;
  createdBy: Person;
  draftSource?: string;
  settings?: Record<string, unknown>;
  draftVersion?: number;
  draftUpdatedAt?: string | null;
  draftUpdatedBy?: Person | null;
}

export interface Page<T> {
  items: T[];
  nextCursor: string | null;
}

// Reviews and comparisons: the API's shapes, named once where the server builds them (type-only, erased in the bundle).
export type { ReviewSummary, ReviewDetail, ReviewInbox, ReviewerView, CommentView, DecisionView, ReviewState } from "../data/reviews";
export type { RevisionSide, RevisionComparison, DraftSide, DraftComparison } from "../data/compare";

/** One figure's change between two library block revisions (from their stored figures). */
export interface FigureDeltaItem {
  figure: string;
  label: string;
  unit: string;
  from: number | null;
  to: number | null;
  delta: number | null;
}

export interface LibraryRevisionItem {
  id: string;
  number: number;
  message: string;
  state: "published" | "awaiting review";
  author: Person;
  createdAt: string;
  inputs: string[];
  outputs: string[];
  family: FamilyRef;
  stats: RevisionStats;
  usedBy?: Array<{ design: Person; revisions: number[] }>;
  deltas?: FigureDeltaItem[] | null;
}

export interface LibraryBlockItem {
  name: string;
  latest: number | null;
  revisions: LibraryRevisionItem[];
}

export interface LibraryItem {
  id: string;
  key: string;
  name: string;
  description: string;
  /** How use lines in this workspace write it. */
  ref: string;
  owner: { slug: string; name: string };
  sharedIn: boolean;
  mayPublish: boolean;
  requireReview: boolean;
  createdAt: string;
  blocks: LibraryBlockItem[];
  shares?: Array<{ workspace: { slug: string; name: string }; createdAt: string; by: Person }> | null;
}
