/**
 * The Content-Security-Policy of every page and API answer, with a fresh nonce
 * per request (Next puts it on its own inline scripts, which is why every page
 * renders per request). The fixed security headers come from next.config.mjs.
 * Next.js looks for this file (its proxy, formerly middleware) beside app/.
 */
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy } from "./lib/api/security-headers";

export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(nonce, process.env.NODE_ENV === "development");
  const requestHeaders = new Headers(request.headers);
  // Next reads the nonce from the request's policy while rendering.
  requestHeaders.set("content-security-policy", csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("content-security-policy", csp);
  return response;
}

export const config = {
  // Built files carry no markup; everything else, pages and /api alike, gets the headers.
  matcher: ["/((?!_next/static|_next/image).*)"],
};
