import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { completePasswordReset } from "@/lib/data/accounts";

export const POST = handle(routes.passwordResetComplete, async ({ req, body }) => {
  limiters.signIn.enforce(`${clientIp(req)}|reset`, "password reset");
  await completePasswordReset(body);
  return { ok: true };
});
