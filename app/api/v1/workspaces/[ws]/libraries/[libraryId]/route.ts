import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getLibrary } from "@/lib/data/libraries";

export const GET = handle(routes.getLibrary, async ({ actor, params }) => ({
  library: await getLibrary({ actor, slug: params.ws, libraryId: params.libraryId }),
}));
