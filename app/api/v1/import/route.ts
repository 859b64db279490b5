import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { previewImport } from "@/lib/data/imports";

export const POST = handle(routes.importPreview, async ({ actor, body }) => previewImport({ actor, ...body }));
