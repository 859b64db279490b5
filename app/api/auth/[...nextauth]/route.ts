import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";
import { clientIp, limiters } from "@/lib/api/rate-limit";
import { errorResponse } from "@/lib/api/errors";

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
      return errorResponse(e);
    }
  }
  return handler(req, ctx);
}

export { handler as GET, POST };
