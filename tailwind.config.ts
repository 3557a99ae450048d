import type { Config } from "tailwindcss";

// Caddis's tokens. Every text/background pair used is checked for WCAG 2.2 AA contrast in
// tests/unit/theme-contrast.test.ts.
export const palette = {
  brand: { DEFAULT: "#0b5563", strong: "#073d47", soft: "#dcebec" },
  paper: { DEFAULT: "#faf7f0", raised: "#ffffff", sunk: "#f1ece1" },
  ink: { DEFAULT: "#1c1f21", soft: "#4f565b" },
  stone: { DEFAULT: "#5d6468", line: "#8c8678", faint: "#d9d3c6" },
  focus: "#b8590a",
  level: {
    emergency: { DEFAULT: "#a4231b", soft: "#fbe6e3", ink: "#7a1710" },
    urgent: { DEFAULT: "#8a4b00", soft: "#fdf0d9", ink: "#6b3a00" },
    soon: { DEFAULT: "#1f4e99", soft: "#e3ecfa", ink: "#173c77" },
    selfcare: { DEFAULT: "#2f6b2f", soft: "#e4f2e1", ink: "#235223" },
  },
  finding: {
    stop: { DEFAULT: "#a4231b", soft: "#fbe6e3" },
    warn: { DEFAULT: "#8a4b00", soft: "#fdf0d9" },
    info: { DEFAULT: "#1f4e99", soft: "#e3ecfa" },
  },
} as const;

const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        sans: ["var(--font-latin)", "var(--font-latin-ext)", "var(--font-arabic)", "system-ui", "sans-serif"],
      },
      fontSize: {
        // Patient pages start at 18 px (visual.md); staff pages at 16 px.
        body: ["1.125rem", { lineHeight: "1.6" }],
        staff: ["1rem", { lineHeight: "1.5" }],
      },
      borderRadius: { card: "0.75rem" },
      minHeight: { target: "3rem" },
      minWidth: { target: "3rem" },
    },
  },
};

export default config;
