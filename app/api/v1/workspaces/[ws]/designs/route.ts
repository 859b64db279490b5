import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createDesign, listDesigns } from "@/lib/data/designs";

export const GET = handle(routes.listDesigns, ({ actor, params, query }) =>
  listDesigns({ actor, slug: params.ws, ...query, archived: query.archived === "1" }),
);
export const POST = handle(routes.createDesign, async ({ actor, params, body }) => ({
  design: await createDesign({ actor, slug: params.ws, ...body }),
}));
