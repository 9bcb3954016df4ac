import type { Config } from "tailwindcss";

/**
 * Tareline's own visual language (PRODUCT.md "Look"): warm paper, graphite ink, a copper
 * accent; severity colours teal (ok), amber (caution), brick red (blocks).
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./inventory/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f5efe3", deep: "#ebe3d3", card: "#fbf8f1" },
        ink: { DEFAULT: "#2a2a2d", soft: "#4b4a4f", faint: "#7b7770", line: "#d9cfbd" },
        copper: { DEFAULT: "#a8592e", dark: "#85431f", light: "#e9c9b1" },
        ok: { DEFAULT: "#1f7a72", bg: "#dcefeb" },
        caution: { DEFAULT: "#a86a0c", bg: "#f7e8c8" },
        blocks: { DEFAULT: "#9c3324", bg: "#f4d9d3" },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
