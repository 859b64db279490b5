import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { requestPasswordReset } from "@/lib/data/accounts";

export const POST = handle(routes.passwordReset, async ({ req, body }) => {
  limiters.mail.enforce(`${clientIp(req)}|${body.email}`, "password reset");
  await requestPasswordReset(body);
  return { ok: true, message: "If an account uses this address, a reset link is on its way." };
});
