import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { revokeToken } from "@/lib/data/tokens";

export const DELETE = handle(routes.revokeToken, async ({ actor, params }) => ({ token: await revokeToken({ actor, id: params.id }) }));
