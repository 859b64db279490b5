import type { Config } from "tailwindcss";

/**
 * The look of a drafting sheet: warm paper, deep ink, graphite for what is
 * secondary, one signal green, amber at a limit and vermilion over it.
 * Colours are CSS variables so that the dark sheet keeps the same names.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.md"],
  darkMode: "media",
  theme: {
    extend: {
      colors: {
        paper: "rgb(var(--paper) / <alpha-value>)",
        sheet: "rgb(var(--sheet) / <alpha-value>)",
        ink: "rgb(var(--ink) / <alpha-value>)",
        graphite: "rgb(var(--graphite) / <alpha-value>)",
        rule: "rgb(var(--rule) / <alpha-value>)",
        accent: "rgb(var(--accent) / <alpha-value>)",
        amber: "rgb(var(--amber) / <alpha-value>)",
        vermilion: "rgb(var(--vermilion) / <alpha-value>)",
      },
      fontFamily: {
        sans: ["var(--font-sans)", "ui-sans-serif", "sans-serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
      fontSize: {
        xs: ["0.75rem", "1.1rem"],
        sm: ["0.8125rem", "1.25rem"],
        base: ["0.9375rem", "1.5rem"],
      },
      borderRadius: { DEFAULT: "3px" },
    },
  },
};

export default config;
