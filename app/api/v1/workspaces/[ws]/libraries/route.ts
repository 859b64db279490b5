import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createLibrary, listLibraries } from "@/lib/data/libraries";

export const GET = handle(routes.listLibraries, async ({ actor, params }) => ({ items: await listLibraries({ actor, slug: params.ws }) }));
export const POST = handle(routes.createLibrary, async ({ actor, params, body }) => ({
  library: await createLibrary({ actor, slug: params.ws, ...body }),
}));
