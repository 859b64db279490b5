import { handle, json } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getDesign } from "@/lib/data/designs";
import { revisionTable } from "@/lib/data/imports";

export const GET = handle(routes.revisionTable, async ({ actor, params, query }) => {
  const t = await revisionTable({ actor, slug: params.ws, designId: params.designId, number: params.number, ...query });
  if (t.kind === "json") return json(t.page);
  const design = await getDesign({ actor, slug: params.ws, designId: params.designId });
  const base = `${design.name}-r${t.number}-table`.replace(/[^A-Za-z0-9._-]+/g, "_");
  return new Response(t.body, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${base}.csv"`,
      "cache-control": "no-store",
    },
  });
});
