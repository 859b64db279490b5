import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { familyMatrix } from "@/lib/data/families";

export const GET = handle(routes.familyMatrix, async ({ actor, params, query }) =>
  familyMatrix({ actor, slug: params.ws, archived: query.archived === "1" }),
);
