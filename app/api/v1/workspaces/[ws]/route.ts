import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getWorkspace, updateWorkspace } from "@/lib/data/workspaces";

export const GET = handle(routes.getWorkspace, async ({ actor, params }) => ({ workspace: await getWorkspace({ actor, slug: params.ws }) }));
export const PATCH = handle(routes.updateWorkspace, async ({ actor, params, body }) => ({
  workspace: await updateWorkspace({ actor, slug: params.ws, ...body }),
}));
