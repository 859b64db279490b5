import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { compareRevisions } from "@/lib/data/compare";

export const GET = handle(routes.compareRevisions, ({ actor, params, query }) =>
  compareRevisions({ actor, slug: params.ws, designId: params.designId, from: query.from, to: query.to }),
);
