import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { shareLibrary } from "@/lib/data/libraries";

export const POST = handle(routes.shareLibrary, async ({ actor, params, body }) => ({
  library: await shareLibrary({ actor, slug: params.ws, libraryId: params.libraryId, workspace: body.workspace }),
}));
