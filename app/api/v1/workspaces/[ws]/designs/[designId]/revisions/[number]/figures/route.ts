import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getRevisionSide } from "@/lib/data/compare";

export const GET = handle(routes.revisionFigures, async ({ actor, params }) => ({
  side: await getRevisionSide({ actor, slug: params.ws, designId: params.designId, number: params.number }),
}));
