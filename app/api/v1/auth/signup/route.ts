import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { createUser } from "@/lib/data/users";

export const POST = handle(routes.signUp, async ({ req, body }) => {
  limiters.signUp.enforce(clientIp(req), "sign-up");
  return { user: await createUser(body) };
});
