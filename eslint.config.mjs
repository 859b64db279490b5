import js from "@eslint/js";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";

// The pipeline stages are pure: data in, data out. These folders may not reach
// the web framework, the database or the process environment.
const pureCore = ["lib/logic/**", "lib/lang/**", "lib/import/**", "lib/minimize/**", "lib/verify/**", "lib/families/**",
  "lib/map/**", "lib/analysis/**", "lib/export/**", "lib/pipeline/**"];

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
    plugins: { "react-hooks": reactHooks },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "warn",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
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
);
