import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getLibraryRevision } from "@/lib/data/libraries";

export const GET = handle(routes.getLibraryRevision, async ({ actor, params }) => ({
  revision: await getLibraryRevision({ actor, slug: params.ws, libraryId: params.libraryId, block: params.block, number: params.number }),
}));
