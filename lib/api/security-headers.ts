/**
 * The Content-Security-Policy of every response, set by proxy.ts (the fixed
 * headers — nosniff, Referrer-Policy, X-Frame-Options — are in next.config.mjs).
 * No outside origin appears anywhere: the app loads nothing from elsewhere.
 */

/**
 * The Content-Security-Policy for one response. Scripts: this site's files and
 * inline scripts carrying `nonce` (Next's own). Styles: this site's, and inline
 * ones, because the Monaco editor sets style attributes in the markup it
 * writes. Workers: this site's, and blob: (Monaco may wrap a worker in one).
 * `dev` adds 'unsafe-eval', which React needs under `next dev` only.
 */
export function contentSecurityPolicy(nonce: string, dev = false): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "manifest-src 'self'",
    "media-src 'none'",
    "object-src 'none'",
    "frame-src 'none'",
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "form-action 'self'",
  ].join("; ");
}
