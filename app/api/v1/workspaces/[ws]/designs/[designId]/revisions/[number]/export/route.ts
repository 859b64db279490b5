import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { exportRevision } from "@/lib/data/revisions";

export const GET = handle(routes.exportRevision, async ({ actor, params, query }) => {
  const file = await exportRevision({ actor, slug: params.ws, designId: params.designId, number: params.number, format: query.format });
  return new Response(file.body, {
    headers: {
      "content-type": file.contentType,
      "content-disposition": `attachment; filename="${file.filename}"`,
      "cache-control": "no-store",
    },
  });
});
