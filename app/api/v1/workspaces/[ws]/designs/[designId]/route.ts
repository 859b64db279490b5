import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getDesign, updateDesign } from "@/lib/data/designs";

export const GET = handle(routes.getDesign, async ({ actor, params }) => ({
  design: await getDesign({ actor, slug: params.ws, designId: params.designId }),
}));
export const PATCH = handle(routes.updateDesign, async ({ actor, params, body }) => ({
  design: await updateDesign({ actor, slug: params.ws, designId: params.designId, ...body }),
}));
