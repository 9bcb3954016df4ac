import type { Config } from "tailwindcss";

/**
 * Tareline's own visual language (PRODUCT.md "Look"): warm paper, graphite ink, actions
 * (buttons, links, focus) in a deep slate blue of our own; copper appears only in the
 * wordmark (components/shell/wordmark.tsx), so it is not a theme colour. Severity colours
 * teal (ok), amber (caution), brick red (blocks).
 *
 * Contrast (WCAG 2.2 AA: 4.5:1 for text, 3:1 for component edges; ratios computed with the
 * WCAG relative-luminance formula on paper #f5efe3 / paper.deep #ebe3d3 / paper.card #fbf8f1):
 * ink 12.5/11.2/13.5, ink.soft 7.7/6.9/8.3, ink.faint 5.6/5.1/6.1, accent 7.9/7.1/8.5,
 * paper.card on accent 8.5, ok 5.5/4.9/5.9 (5.3 on ok.bg), caution 5.4/4.8/5.8 (5.1 on
 * caution.bg), blocks 6.3/5.7/6.8 (5.4 on blocks.bg), ink.edge (input borders) 3.1/–/3.4.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./inventory/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f5efe3", deep: "#ebe3d3", card: "#fbf8f1" },
        ink: { DEFAULT: "#2a2a2d", soft: "#4b4a4f", faint: "#625e57", line: "#d9cfbd", edge: "#8f8676" },
        accent: { DEFAULT: "#2f4a6d", dark: "#243b58", light: "#dfe5ee" },
        ok: { DEFAULT: "#1a6b64", bg: "#dcefeb" },
        caution: { DEFAULT: "#8a5607", bg: "#f7e8c8" },
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
