// Gusset's type, radius and shadow. Loaded by Tailwind v4 through `@config` in app/globals.css, which
// holds the palette itself (as @theme variables, with the contrast ratios of every text colour).
import type { Config } from "tailwindcss";

const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
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
