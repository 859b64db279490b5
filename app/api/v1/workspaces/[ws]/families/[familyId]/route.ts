import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { deleteFamily, getFamily, updateFamily } from "@/lib/data/families";

export const GET = handle(routes.getFamily, async ({ actor, params }) => ({
  family: await getFamily({ actor, slug: params.ws, familyId: params.familyId }),
}));
export const PATCH = handle(routes.updateFamily, async ({ actor, params, body }) => ({
  family: await updateFamily({ actor, slug: params.ws, familyId: params.familyId, ...body }),
}));
export const DELETE = handle(routes.deleteFamily, async ({ actor, params }) => {
  await deleteFamily({ actor, slug: params.ws, familyId: params.familyId });
  return { ok: true };
});
