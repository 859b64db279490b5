import { handle, json } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { openApiDocument } from "@/lib/api/openapi";

export const GET = handle(routes.openapi, async () => json(openApiDocument(), 200, { "cache-control": "public, max-age=60" }));
