// The fixed security headers for everything served, built files included; the
// Content-Security-Policy (with its per-request nonce) comes from proxy.ts.
const fixedHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  // For browsers that predate the policy's frame-ancestors 'none'.
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect at run time; bundling it breaks the server build.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "logic-solver", "highs", "elkjs", "nodemailer",
    "rate-limiter-flexible", "@zxcvbn-ts/core", "@zxcvbn-ts/language-common"],
  poweredByHeader: false,
  reactStrictMode: true,
  typedRoutes: false,
  // `npm test` runs tsc over the whole project as its own step.
  typescript: { ignoreBuildErrors: true },
  outputFileTracingRoot: import.meta.dirname,
  // The test command builds into its own folder so a running `npm start` keeps its build.
  distDir: process.env.FANBOUND_DIST_DIR || ".next",
  async headers() {
    return [{ source: "/:path*", headers: fixedHeaders }];
  },
};

export default nextConfig;
