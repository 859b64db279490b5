import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createRevision, listRevisions } from "@/lib/data/revisions";

export const GET = handle(routes.listRevisions, ({ actor, params, query }) =>
  listRevisions({ actor, slug: params.ws, designId: params.designId, ...query }),
);
export const POST = handle(routes.createRevision, async ({ actor, params, body }) => ({
  revision: await createRevision({ actor, slug: params.ws, designId: params.designId, ...body }),
}));
