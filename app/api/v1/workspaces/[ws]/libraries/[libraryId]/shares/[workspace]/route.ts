import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { unshareLibrary } from "@/lib/data/libraries";

export const DELETE = handle(routes.unshareLibrary, async ({ actor, params }) => ({
  library: await unshareLibrary({ actor, slug: params.ws, libraryId: params.libraryId, workspace: params.workspace }),
}));
