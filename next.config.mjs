/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect at run time; bundling it breaks the server build.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "logic-solver", "highs", "elkjs", "nodemailer", "piscina", "pg-boss"],
  poweredByHeader: false,
  reactStrictMode: true,
  typedRoutes: false,
  // `npm test` runs tsc over the whole project as its own step.
  typescript: { ignoreBuildErrors: true },
  outputFileTracingRoot: import.meta.dirname,
  // The test command builds into its own folder so a running `npm start` keeps its build.
  distDir: process.env.FANBOUND_DIST_DIR || ".next",
};

export default nextConfig;
