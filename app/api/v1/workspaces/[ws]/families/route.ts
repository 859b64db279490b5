import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createFamily, listFamilies } from "@/lib/data/families";

export const GET = handle(routes.listFamilies, async ({ actor, params }) => ({ items: await listFamilies({ actor, slug: params.ws }) }));
export const POST = handle(routes.createFamily, async ({ actor, params, body }) => ({
  family: await createFamily({ actor, slug: params.ws, ...body }),
}));
