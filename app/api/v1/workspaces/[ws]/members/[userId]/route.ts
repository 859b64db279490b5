import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { removeMember, updateMemberRole } from "@/lib/data/members";

export const PATCH = handle(routes.updateMember, async ({ actor, params, body }) => ({
  member: await updateMemberRole({ actor, slug: params.ws, userId: params.userId, role: body.role }),
}));
export const DELETE = handle(routes.removeMember, async ({ actor, params }) => {
  await removeMember({ actor, slug: params.ws, userId: params.userId });
  return { ok: true };
});
