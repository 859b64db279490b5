import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { afterResponse } from "@/lib/api/after";
import { registerUser } from "@/lib/data/users";
import { mailAfterSignUp } from "@/lib/data/accounts";

// A new address and one with an account get the same answer after the same work;
// the mail that differs (a confirmation link, or a note to the owner) goes after it.
export const POST = handle(routes.signUp, async ({ body }) => {
  const { created, email } = await registerUser(body);
  afterResponse(() => mailAfterSignUp({ email, created, callbackUrl: body.callbackUrl }));
  return { ok: true, message: `Check your mail at ${email}: the message we sent says how to go on.` };
});
