// Gusset's palette and type. Loaded by Tailwind v4 through `@config` in app/globals.css.
// Neutrals are a cool "ink on drawing paper" scale; the accent is a weathered-steel teal chosen for
// calm contrast on long reading sessions. Status colours are reserved for meaning (pass, warn, fault).
import type { Config } from "tailwindcss";

const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f6f5f1", raised: "#ffffff", sunk: "#eeece6" },
        ink: {
          950: "#141a23",
          900: "#1c2430",
          700: "#394356",
          500: "#5f697c",
          400: "#838c9c",
          300: "#b7bec9",
          200: "#d5d9e0",
          100: "#e7e9ed",
        },
        plate: {
          900: "#123c40",
          800: "#184b50",
          700: "#1f5a5f",
          600: "#276f75",
          500: "#31868c",
          200: "#b9dcd9",
          100: "#dcedeb",
          50: "#eef6f5",
        },
        pass: { 700: "#24603f", 100: "#dcefe3" },
        warn: { 700: "#8a5a12", 100: "#f6ead2" },
        fault: { 700: "#a3271f", 600: "#b9332a", 100: "#f8e1de" },
      },
      fontFamily: {
        sans: ["var(--font-gusset-sans)", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "Consolas", "monospace"],
      },
      borderRadius: { plate: "0.375rem" },
      boxShadow: { sheet: "0 1px 2px rgb(20 26 35 / 0.06), 0 1px 1px rgb(20 26 35 / 0.04)" },
    },
  },
};

export default config;
