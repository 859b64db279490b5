import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { publishBlock } from "@/lib/data/libraries";

export const POST = handle(routes.publishBlock, async ({ actor, params, body }) => ({
  revision: await publishBlock({ actor, slug: params.ws, libraryId: params.libraryId, block: params.block, ...body }),
}));
