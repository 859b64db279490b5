import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { saveDraft } from "@/lib/data/designs";

export const PUT = handle(routes.saveDraft, async ({ actor, params, body }) => ({
  design: await saveDraft({ actor, slug: params.ws, designId: params.designId, ...body }),
}));
