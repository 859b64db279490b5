import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { completePasswordReset } from "@/lib/data/accounts";

export const POST = handle(routes.passwordResetComplete, async ({ body }) => {
  const { tokensRevoked } = await completePasswordReset(body);
  return { ok: true, tokensRevoked };
});
