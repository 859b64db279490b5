import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { compareDraft } from "@/lib/data/compare";

// A client that goes away stops the draft's compile with it.
export const GET = handle(routes.compareDraft, ({ req, actor, params, query }) =>
  compareDraft({ actor, slug: params.ws, designId: params.designId, from: query.from, signal: req.signal }),
);
