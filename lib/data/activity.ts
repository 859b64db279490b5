import "server-only";
/**
 * The workspace's activity list: who changed which membership, invitation,
 * family, design or library, and when. The data functions that make those
 * changes record them here, inside their own transaction where they have one.
 * Entries are never changed or deleted: a database trigger refuses it.
 *
 * Every member may read the list, except the entries about invitations (the
 * invited addresses), which only those who manage invitations see.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { db } from "../db/connection";
import { can } from "../auth/permissions";
import type { ActivityKind } from "../../models";
import { decodeCursor, encodeCursor, iso, requireAccess, type Actor } from "./access";

export type ActivityAction =
  | "member.join"
  | "member.role"
  | "member.remove"
  | "invitation.create"
  | "invitation.resend"
  | "invitation.revoke"
  | "family.create"
  | "family.update"
  | "family.archive"
  | "family.restore"
  | "family.delete"
  | "design.create"
  | "design.rename"
  | "design.family"
  | "design.archive"
  | "design.restore"
  | "design.revision";

export interface ActivityInput {
  workspaceId: string;
  /** null for changes the system makes (the demo seed). */
  actorId: string | null;
  action: ActivityAction;
  subject: { kind: ActivityKind; id: string | null; label: string };
  details?: Record<string, unknown>;
}

/** Appends one entry; pass the transaction of the change so both land or neither. */
export async function recordActivity(entry: ActivityInput, transaction?: Transaction): Promise<void> {
  await db().models.Activity.create(
    {
      workspaceId: entry.workspaceId,
      actorId: entry.actorId,
      action: entry.action,
      subjectKind: entry.subject.kind,
      subjectId: entry.subject.id,
      subjectLabel: entry.subject.label.slice(0, 254),
      details: entry.details ?? {},
    },
    transaction ? { transaction } : {},
  );
}

export interface ActivityView {
  id: string;
  at: string;
  actor: { id: string; name: string } | null;
  action: string;
  subject: { kind: string; id: string | null; label: string };
  details: Record<string, unknown>;
  /** The entry as a sentence after the actor's name, e.g. "changed Ada's role from viewer to designer". */
  summary: string;
}

const q = (s: unknown) => `“${String(s)}”`;

/** The entry in words (the actor's name goes before it). */
export function describeActivity(action: string, label: string, d: Record<string, unknown>): string {
  switch (action) {
    case "member.join":
      return `accepted the invitation and joined as ${d.role}`;
    case "member.role":
      return `changed the role of ${label} from ${d.from} to ${d.to}`;
    case "member.remove":
      return `removed ${label} from the workspace (was ${d.role})`;
    case "invitation.create":
      return `invited ${label} as ${d.role}`;
    case "invitation.resend":
      return `sent the invitation to ${label} again (the earlier link no longer works)`;
    case "invitation.revoke":
      return `cancelled the invitation to ${label}`;
    case "family.create":
      return d.copiedFrom ? `added the family ${q(label)}, copied from ${q(d.copiedFrom)}` : `added the family ${q(label)}`;
    case "family.update": {
      const changed = Array.isArray(d.changed) ? (d.changed as string[]) : [];
      return `changed the family ${q(label)}${changed.length ? `: ${changed.join(", ")}` : ""}`;
    }
    case "family.archive":
      return `archived the family ${q(label)}`;
    case "family.restore":
      return `restored the family ${q(label)}`;
    case "family.delete":
      return `deleted the unused family ${q(label)}`;
    case "design.create":
      return `created the design ${q(label)} on ${d.family ?? "its family"}`;
    case "design.rename":
      return `renamed the design ${q(d.from)} to ${q(d.to)}`;
    case "design.family":
      return `moved the design ${q(label)} from ${d.from} to ${d.to}`;
    case "design.archive":
      return `archived the design ${q(label)}`;
    case "design.restore":
      return `restored the design ${q(label)}`;
    case "design.revision":
      return `saved revision r${d.number} of ${q(label)}${d.message ? `: ${String(d.message).slice(0, 120)}` : ""}`;
    default:
      return `${action} ${label}`;
  }
}

interface Row {
  id: string;
  created_at: Date;
  action: string;
  subject_kind: string;
  subject_id: string | null;
  subject_label: string;
  details: Record<string, unknown>;
  actor_id: string | null;
  actor_name: string | null;
}

/**
 * One page of the workspace's activity, newest first (any member; entries
 * about invitations only for those who manage them). Default limit 50, max 200.
 */
export async function listActivity(p: { actor: Actor | null; slug: string; limit?: number; cursor?: string }): Promise<{
  items: ActivityView[];
  nextCursor: string | null;
}> {
  const { workspace, role } = await requireAccess(p.actor, p.slug, "workspace.read");
  const limit = Math.min(Math.max(p.limit ?? 50, 1), 200);
  const offset = decodeCursor(p.cursor);
  const hideInvitations = !can(role, "invitation.manage");
  const rows = await db().sequelize.query<Row>(
    `SELECT a.id, a.created_at, a.action, a.subject_kind, a.subject_id, a.subject_label, a.details,
            u.id AS actor_id, u.name AS actor_name
     FROM activity a LEFT JOIN users u ON u.id = a.actor_id
     WHERE a.workspace_id = :ws ${hideInvitations ? "AND a.subject_kind <> 'invitation'" : ""}
     ORDER BY a.created_at DESC, a.id DESC LIMIT :limit OFFSET :offset`,
    { replacements: { ws: workspace.id, limit: limit + 1, offset }, type: QueryTypes.SELECT },
  );
  const more = rows.length > limit;
  return {
    items: rows.slice(0, limit).map((r) => ({
      id: r.id,
      at: iso(r.created_at)!,
      actor: r.actor_id ? { id: r.actor_id, name: r.actor_name ?? "" } : null,
      action: r.action,
      subject: { kind: r.subject_kind, id: r.subject_id, label: r.subject_label },
      details: r.details ?? {},
      summary: describeActivity(r.action, r.subject_label, r.details ?? {}),
    })),
    nextCursor: more ? encodeCursor(offset + limit) : null,
  };
}
