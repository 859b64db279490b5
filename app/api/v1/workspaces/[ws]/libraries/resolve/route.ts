import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { resolveUses } from "@/lib/data/libraries";

export const POST = handle(routes.resolveUses, async ({ actor, params, body }) => ({
  items: await resolveUses({ actor, slug: params.ws, uses: body.uses }),
}));
