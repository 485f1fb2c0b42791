import type { Config } from "tailwindcss";

/**
 * Ondula's design tokens (see shared design "look"): a warm paper ground, near-black ink,
 * graphite secondary text, a faint rule; role colours from the Okabe–Ito palette
 * (Okabe & Ito, Color Universal Design, 2008). Ink on paper ≈ 15:1, graphite on paper ≈ 7.4:1.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#FBF8F1", deep: "#F3EDE0", card: "#FFFDF8" },
        ink: { DEFAULT: "#1B1A17", soft: "#2E2C27" },
        graphite: "#4A4740",
        rule: "#DDD5C4",
        accent: { DEFAULT: "#0072B2", strong: "#005A8C" },
        role: {
          start: "#009E73",
          peak: "#D55E00",
          tension: "#CC79A7",
          resolution: "#0072B2",
        },
        caution: "#E69F00",
        sky: "#56B4E9",
        danger: "#A8320A",
      },
      fontFamily: {
        // The plain zero first (see app/globals.css): the interface font's own zero is slashed.
        sans: ['"Ondula Plain Zero"', "var(--font-sans)", "system-ui", "sans-serif"],
        serif: ["var(--font-serif)", "Georgia", "serif"],
      },
      fontSize: {
        xs: ["0.75rem", { lineHeight: "1.1rem" }],
        sm: ["0.875rem", { lineHeight: "1.3rem" }],
        base: ["1rem", { lineHeight: "1.55rem" }],
        lg: ["1.2rem", { lineHeight: "1.7rem" }],
        xl: ["1.5rem", { lineHeight: "2rem" }],
        "2xl": ["2rem", { lineHeight: "2.5rem" }],
        "3xl": ["2.75rem", { lineHeight: "3.2rem" }],
      },
      spacing: { gutter: "1.5rem", rail: "20rem" },
      borderRadius: { card: "0.75rem" },
    },
  },
};
export default config;
