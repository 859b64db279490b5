import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { afterResponse } from "@/lib/api/after";
import { requestPasswordReset } from "@/lib/data/accounts";

// The look-up and the mail happen after the answer, which is the same for every address.
export const POST = handle(routes.passwordReset, async ({ body }) => {
  afterResponse(() => requestPasswordReset(body));
  return { ok: true, message: "If an account uses this address, a reset link is on its way." };
});
