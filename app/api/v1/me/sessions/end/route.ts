import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { endMySessions } from "@/lib/data/users";

export const POST = handle(routes.endSessions, async ({ actor }) => {
  await endMySessions({ actor });
  return { ok: true };
});
