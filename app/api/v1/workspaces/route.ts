import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createWorkspace, listWorkspaces } from "@/lib/data/workspaces";

export const GET = handle(routes.listWorkspaces, async ({ actor }) => ({ items: await listWorkspaces({ actor }) }));
export const POST = handle(routes.createWorkspace, async ({ actor, body }) => ({ workspace: await createWorkspace({ actor, ...body }) }));
