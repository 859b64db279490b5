/**
 * The one place where roles are decided. Every check in lib/data asks
 * `can(role, action)`; nothing else compares role names.
 */
import type { Role } from "../../models";

export type { Role };

export const ACTIONS = [
  "workspace.read",
  "workspace.settings",
  "member.read",
  "member.manage",
  "invitation.manage",
  "family.read",
  "family.manage",
  "design.read",
  "design.edit",
  "revision.read",
  "revision.save",
  "review.request",
  "review.manage",
  "review.comment",
  "review.approve",
  "compile.run",
  "library.read",
  "library.edit",
  "library.publish",
  "library.share",
] as const;
export type Action = (typeof ACTIONS)[number];

const READ = {
  "workspace.read": true,
  "member.read": true,
  "family.read": true,
  "design.read": true,
  "revision.read": true,
  "compile.run": true,
  "library.read": true,
} as const;

export const PERMISSIONS: Record<Role, Record<Action, boolean>> = {
  owner: {
    ...READ,
    "workspace.settings": true,
    "member.manage": true,
    "invitation.manage": true,
    "family.manage": true,
    "design.edit": true,
    "revision.save": true,
    "review.request": true,
    "review.manage": true,
    "review.comment": true,
    "review.approve": true,
    "library.edit": true,
    "library.publish": true,
    "library.share": true,
  },
  designer: {
    ...READ,
    "workspace.settings": false,
    "member.manage": false,
    "invitation.manage": false,
    "family.manage": false,
    "design.edit": true,
    "revision.save": true,
    "review.request": true,
    "review.manage": false,
    "review.comment": true,
    "review.approve": false,
    "library.edit": true,
    "library.publish": true,
    "library.share": false,
  },
  reviewer: {
    ...READ,
    "workspace.settings": false,
    "member.manage": false,
    "invitation.manage": false,
    "family.manage": false,
    "design.edit": false,
    "revision.save": false,
    "review.request": false,
    "review.manage": false,
    "review.comment": true,
    "review.approve": true,
    "library.edit": false,
    "library.publish": false,
    "library.share": false,
  },
  viewer: {
    ...READ,
    "workspace.settings": false,
    "member.manage": false,
    "invitation.manage": false,
    "family.manage": false,
    "design.edit": false,
    "revision.save": false,
    "review.request": false,
    "review.manage": false,
    "review.comment": false,
    "review.approve": false,
    "library.edit": false,
    "library.publish": false,
    "library.share": false,
  },
};

/** Whether a member with this role may take this action. */
export function can(role: Role, action: Action): boolean {
  return PERMISSIONS[role][action];
}
