import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { requestSignInLink } from "@/lib/data/accounts";

export const POST = handle(routes.emailLink, async ({ req, body }) => {
  limiters.mail.enforce(`${clientIp(req)}|${body.email}`, "sign-in link");
  await requestSignInLink(body);
  return { ok: true, message: "If an account uses this address, a sign-in link is on its way." };
});
