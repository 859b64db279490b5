import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { approveLibraryRevision } from "@/lib/data/libraries";

export const POST = handle(routes.approveLibraryRevision, async ({ actor, params, body }) => ({
  revision: await approveLibraryRevision({ actor, slug: params.ws, libraryId: params.libraryId, block: params.block, number: params.number, ...body }),
}));
