import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { AppError, errorBody } from "@/lib/api/errors";

const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

/** Sign-in attempts are limited per IP and e-mail (or per IP for links) before next-auth sees them. */
async function POST(req: Request, ctx: Ctx) {
  const { nextauth } = await ctx.params;
  if (nextauth[0] === "callback" && (nextauth[1] === "password" || nextauth[1] === "email-link")) {
    let email = "";
    try {
      const form = await req.clone().formData();
      email = String(form.get("email") ?? "").trim().toLowerCase();
    } catch {
      // An unreadable form is next-auth's to refuse.
    }
    try {
      limiters.signIn.enforce(`${clientIp(req)}|${nextauth[1]}|${email}`, "sign-in");
    } catch (e) {
      if (!(e instanceof AppError)) throw e;
      // next-auth's client reads `url` from the answer; it carries the error to the sign-in form.
      const url = new URL("/signin?error=RateLimited", process.env.NEXTAUTH_URL ?? req.url).toString();
      return new Response(JSON.stringify({ ...errorBody(e), url }), {
        status: 429,
        headers: { "content-type": "application/json", "retry-after": String(e.retryAfter ?? 60) },
      });
    }
  }
  return handler(req, ctx);
}

export { handler as GET, POST };
