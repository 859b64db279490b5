import js from "@eslint/js";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";
import importX from "eslint-plugin-import-x";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";

// The pipeline stages are pure: data in, data out. These folders may not reach
// the web framework, the database or the process environment.
const pureCore = ["lib/logic/**", "lib/lang/**", "lib/import/**", "lib/minimize/**", "lib/verify/**", "lib/families/**",
  "lib/factor/**", "lib/map/**", "lib/analysis/**", "lib/export/**", "lib/pipeline/**", "lib/review/**", "lib/libraries/**"];

export default tseslint.config(
  { ignores: ["node_modules/**", ".next/**", ".next-*/**", ".data/**", ".build/**", ".build.*/**", "test-results/**", "next-env.d.ts"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,mjs}"],
    languageOptions: {
      globals: { process: "readonly", console: "readonly", Buffer: "readonly", URL: "readonly", self: "readonly",
        window: "readonly", document: "readonly", setTimeout: "readonly", clearTimeout: "readonly",
        setInterval: "readonly", clearInterval: "readonly", fetch: "readonly", Response: "readonly",
        Request: "readonly", Headers: "readonly", AbortController: "readonly", AbortSignal: "readonly",
        performance: "readonly", structuredClone: "readonly", TextEncoder: "readonly", TextDecoder: "readonly",
        crypto: "readonly", Worker: "readonly", navigator: "readonly", localStorage: "readonly",
        queueMicrotask: "readonly", globalThis: "readonly" },
    },
    plugins: { "react-hooks": reactHooks, "import-x": importX },
    settings: {
      "import-x/parsers": { "@typescript-eslint/parser": [".ts", ".tsx"] },
      "import-x/resolver-next": [createTypeScriptImportResolver({ project: "tsconfig.json" })],
    },
    rules: {
      // No module may reach itself again through its imports (type-only imports included).
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "warn",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
    },
  },
  {
    // Type-aware checks of the TypeScript sources (the .mjs scripts run before the packages are installed).
    files: ["**/*.{ts,tsx}"],
    languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname } },
    rules: {
      // A promise nobody awaits loses its error: await it, return it, or mark it with void.
      "@typescript-eslint/no-floating-promises": "error",
      "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
    },
  },
  {
    files: pureCore.map((g) => g.replace("**", "**/*.ts")),
    rules: {
      "no-restricted-imports": ["error", {
        patterns: [
          { group: ["next", "next/*", "react", "react-dom", "sequelize", "pg", "next-auth", "next-auth/*"], message: "the pipeline core is pure: no framework or database imports" },
          { group: ["node:fs", "fs", "node:child_process", "child_process", "node:worker_threads"], message: "the pipeline core is pure: no file, process or thread access" },
          { group: ["**/db/*", "**/data/*", "**/models", "**/models/*"], message: "the pipeline core does not reach the database" },
        ],
      }],
      "no-restricted-properties": ["error", { object: "process", property: "env", message: "the pipeline core takes settings as arguments, not from the environment" }],
    },
  },
  // The layers, bottom up: lib/errors and lib/auth (primitives) → lib/runtime and lib/data → lib/identity
  // (who a request acts for) → lib/api (HTTP). A lower layer never imports a higher one.
  {
    files: ["lib/errors.ts", "lib/auth/**/*.ts", "lib/runtime/**/*.ts", "lib/data/**/*.ts", "lib/db/**/*.ts"],
    rules: {
      "no-restricted-imports": ["error", {
        patterns: [
          { group: ["**/api/*", "@/lib/api/*"], message: "lib/api is the HTTP layer, above this one: take errors from lib/errors and schemas from lib/pipeline" },
          { group: ["**/identity/*", "@/lib/identity/*"], message: "lib/identity (request identity) sits above the data layer: take the Actor type from lib/auth/identity" },
        ],
      }],
    },
  },
);
