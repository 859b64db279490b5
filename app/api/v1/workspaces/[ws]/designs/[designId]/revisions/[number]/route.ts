import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getRevision } from "@/lib/data/revisions";

export const GET = handle(routes.getRevision, async ({ actor, params }) => ({
  revision: await getRevision({ actor, slug: params.ws, designId: params.designId, number: params.number }),
}));
