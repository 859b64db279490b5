import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { listActivity } from "@/lib/data/activity";

export const GET = handle(routes.listActivity, async ({ actor, params, query }) =>
  listActivity({ actor, slug: params.ws, limit: query.limit, cursor: query.cursor }),
);
