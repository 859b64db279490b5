import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { afterResponse } from "@/lib/api/after";
import { requestSignInLink } from "@/lib/data/accounts";

// The look-up and the mail happen after the answer, which is the same for every address.
export const POST = handle(routes.emailLink, async ({ body }) => {
  afterResponse(() => requestSignInLink(body));
  return { ok: true, message: "If an account uses this address, a sign-in link is on its way." };
});
