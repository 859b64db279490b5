import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { revokeInvitation } from "@/lib/data/invitations";

export const DELETE = handle(routes.revokeInvitation, async ({ actor, params }) => ({
  invitation: await revokeInvitation({ actor, slug: params.ws, id: params.id }),
}));
