import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { confirmEmail } from "@/lib/data/accounts";

export const POST = handle(routes.verifyEmail, async ({ body }) => {
  const user = await confirmEmail(body);
  return { ok: true, email: user.email };
});
