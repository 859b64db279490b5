import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { acceptInvitation } from "@/lib/data/invitations";

export const POST = handle(routes.acceptInvitation, ({ actor, body }) => acceptInvitation({ actor, token: body.token }));
