import NextAuth from "next-auth";
import { NextRequest } from "next/server";
import { authOptions } from "@/lib/identity/options";
import { clientIp, enforceLimits } from "@/lib/api/rate-limit";
import { signInLimits } from "@/lib/api/routes";
import { findUnstorableText, readBodyText, unstorableTextError } from "@/lib/api/body";
import { AppError, errorBody } from "@/lib/api/errors";

const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

/** Largest sign-in form accepted: 16 KiB (an address, a password or link secret, a CSRF token, a callback). */
const MAX_FORM_BYTES = 16 * 1024;

/**
 * The sign-in form, read once: form-encoded (415 otherwise), each field at most
 * once (400: next-auth would read the last copy of a field, a limit keyed on
 * the first one would count another account), no NUL.
 */
async function readSignInForm(req: Request): Promise<URLSearchParams> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^application\/x-www-form-urlencoded\s*(?:;|$)/i.test(type)) {
    throw new AppError("unsupported_media_type", "Send the sign-in form as application/x-www-form-urlencoded.", { contentType: type || null });
  }
  const form = new URLSearchParams(await readBodyText(req, MAX_FORM_BYTES));
  const seen = new Set<string>();
  for (const key of form.keys()) {
    if (seen.has(key)) {
      throw new AppError("invalid_input", `The form has the field ${key} more than once; send each field once.`, [
        { path: key, code: "duplicate", message: "given more than once" },
      ]);
    }
    seen.add(key);
  }
  const bad = findUnstorableText(Object.fromEntries(form));
  if (bad) throw unstorableTextError("form", bad);
  return form;
}

/**
 * Password and link sign-ins pass the limits declared in lib/api/routes.ts
 * (signInLimits), keyed on the very address next-auth then checks: the form
 * is parsed here once and handed on as parsed.
 */
async function POST(req: Request, ctx: Ctx) {
  const { nextauth } = await ctx.params;
  const provider = nextauth[0] === "callback" ? nextauth[1] : undefined;
  if (provider !== "password" && provider !== "email-link") return handler(req, ctx);
  let form: URLSearchParams;
  try {
    form = await readSignInForm(req);
    // The same normalisation as the password provider's schema (lib/identity/options.ts).
    const email = provider === "password" ? (form.get("email") ?? "").trim().toLowerCase() : null;
    await enforceLimits(signInLimits[provider], { caller: clientIp(req), email });
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    // next-auth's client reads `url` from the answer; it carries the error to the sign-in form.
    const code = e.code === "rate_limited" ? "RateLimited" : "BadRequest";
    const url = new URL(`/signin?error=${code}`, process.env.NEXTAUTH_URL ?? req.url).toString();
    const headers: Record<string, string> = { "content-type": "application/json", "cache-control": "no-store" };
    if (e.retryAfter !== undefined) headers["retry-after"] = String(e.retryAfter);
    return new Response(JSON.stringify({ ...errorBody(e), url }), { status: e.status, headers });
  }
  const headers = new Headers(req.headers);
  headers.delete("content-length");
  headers.set("content-type", "application/x-www-form-urlencoded");
  return handler(new NextRequest(req.url, { method: "POST", headers, body: form.toString() }), ctx);
}

export { handler as GET, POST };
