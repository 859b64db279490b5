import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createToken, listTokens } from "@/lib/data/tokens";

export const GET = handle(routes.listTokens, async ({ actor }) => ({ items: await listTokens({ actor }) }));
export const POST = handle(routes.createToken, ({ actor, body }) =>
  createToken({ actor, name: body.name, expiresAt: new Date(body.expiresAt) }),
);
