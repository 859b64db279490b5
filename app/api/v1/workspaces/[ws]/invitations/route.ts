import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createInvitation, listInvitations } from "@/lib/data/invitations";

export const GET = handle(routes.listInvitations, async ({ actor, params }) => ({ items: await listInvitations({ actor, slug: params.ws }) }));
export const POST = handle(routes.createInvitation, async ({ actor, params, body }) => ({
  invitation: await createInvitation({ actor, slug: params.ws, ...body }),
}));
