import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { listMembers } from "@/lib/data/members";

export const GET = handle(routes.listMembers, async ({ actor, params }) => ({ items: await listMembers({ actor, slug: params.ws }) }));
