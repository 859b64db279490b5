import "server-only";
/**
 * The checks every data function starts with: the caller is a member of the
 * workspace named by the slug, and the role allows the action. A workspace
 * the caller does not belong to is reported as missing (404), never as
 * forbidden, so its existence is not revealed.
 */
import { db } from "../db/connection";
import { can, type Action, type Role } from "../auth/permissions";
import type { Actor } from "../auth/identity";
import { forbidden, notFound, unauthenticated } from "../errors";
import type { Workspace } from "../../models";

export type { Actor };

const ACTION_WORDS: Record<Action, string> = {
  "workspace.read": "reading this workspace",
  "workspace.settings": "changing the workspace settings",
  "member.read": "listing members",
  "member.manage": "managing members",
  "invitation.manage": "managing invitations",
  "family.read": "reading families",
  "family.manage": "managing this workspace's families",
  "design.read": "reading designs",
  "design.edit": "creating or editing designs",
  "revision.read": "reading revisions",
  "revision.save": "saving revisions",
  "review.request": "asking for reviews",
  "review.manage": "withdrawing someone else's review",
  "review.comment": "commenting on reviews",
  "review.approve": "approving revisions",
  "compile.run": "compiling",
  "library.read": "reading libraries",
  "library.edit": "creating libraries",
  "library.publish": "publishing blocks to a library",
  "library.share": "sharing libraries with other workspaces",
};

export interface Access {
  workspace: Workspace;
  role: Role;
}

/** Loads the workspace and the caller's role; throws 401/404/403 as fits. */
export async function requireAccess(actor: Actor | null | undefined, slug: string, action: Action): Promise<Access> {
  if (!actor?.userId) throw unauthenticated();
  const { Workspace } = db().models;
  // One statement for the workspace and the caller's role: every workspace request starts here.
  const rows = await db().sequelize.query(
    `SELECT w.*, m.role AS member_role FROM workspaces w JOIN memberships m ON m.workspace_id = w.id AND m.user_id = $2 WHERE w.slug = $1`,
    { bind: [slug, actor.userId], model: Workspace, mapToModel: true },
  );
  const workspace = rows[0];
  if (!workspace) throw notFound("workspace");
  const role = workspace.get("member_role") as Role;
  if (!can(role, action)) throw forbidden(ACTION_WORDS[action]);
  return { workspace, role };
}

/** The caller must be signed in; returns the user id. */
export function requireActor(actor: Actor | null | undefined): string {
  if (!actor?.userId) throw unauthenticated();
  return actor.userId;
}

/** An opaque page cursor (an offset); lists order by stable keys so offsets stay meaningful. */
export function encodeCursor(offset: number): string {
  return Buffer.from(`o:${offset}`).toString("base64url");
}

export function decodeCursor(cursor: string | undefined | null): number {
  if (!cursor) return 0;
  const m = /^o:(\d{1,9})$/.exec(Buffer.from(cursor, "base64url").toString("utf8"));
  return m ? Number(m[1]) : 0;
}

export const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null);
