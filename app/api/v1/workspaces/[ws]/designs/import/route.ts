import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createImportedDesign } from "@/lib/data/imports";

export const POST = handle(routes.importDesign, async ({ actor, params, body }) => createImportedDesign({ actor, slug: params.ws, ...body }));
