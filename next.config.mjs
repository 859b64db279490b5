/**
 * The Content-Security-Policy of everything served. No outside origin appears
 * anywhere: the app loads nothing from elsewhere. Scripts: this site's files,
 * and inline ones — Next writes its page bootstrap inline, and a nonce for it
 * would need a request proxy file beside app/, which the project's fixed
 * layout does not have. Styles: inline too, because the Monaco editor sets
 * style attributes in the markup it writes. Workers: this site's, and blob:
 * (Monaco may wrap a worker in one). `next dev` also needs 'unsafe-eval'.
 */
const dev = process.env.NODE_ENV === "development";
const contentSecurityPolicy = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ""}`,
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

// The security headers of everything served, built files included.
const fixedHeaders = [
  { key: "Content-Security-Policy", value: contentSecurityPolicy },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  // For browsers that predate the policy's frame-ancestors 'none'.
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect at run time; bundling it breaks the server build.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "logic-solver", "highs", "elkjs", "nodemailer", "piscina", "pg-boss",
    "rate-limiter-flexible", "@zxcvbn-ts/core", "@zxcvbn-ts/language-common"],
  poweredByHeader: false,
  reactStrictMode: true,
  typedRoutes: false,
  outputFileTracingRoot: import.meta.dirname,
  // The test command builds into its own folder so a running `npm start` keeps its build.
  distDir: process.env.FANBOUND_DIST_DIR || ".next",
  async headers() {
    return [{ source: "/:path*", headers: fixedHeaders }];
  },
};

export default nextConfig;
