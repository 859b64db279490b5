import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { resendInvitation } from "@/lib/data/invitations";

export const POST = handle(routes.resendInvitation, async ({ actor, params }) => ({
  invitation: await resendInvitation({ actor, slug: params.ws, id: params.id }),
}));
