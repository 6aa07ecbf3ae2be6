import type { Config } from "tailwindcss";

/**
 * Rootbank's palette: river water and dry-season soil. Status bands use a single sequence from wet
 * (deep water) to dry (burnt clay) so the order reads without relying on red and green.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/client/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: "#f6f3ec",
        ink: "#17261f",
        river: { 50: "#eef6f8", 100: "#d5eaef", 300: "#7fb8c7", 500: "#2f7f96", 700: "#1d5566", 900: "#0f3340" },
        clay: { 50: "#fbf3ec", 100: "#f3dfcc", 300: "#dca37a", 500: "#b8653a", 700: "#7e3f1f", 900: "#4a230f" },
        reed: { 100: "#e4ecd9", 500: "#6b8a4a", 700: "#44592d" },
        band: {
          soaked: "#1d5566",
          comfortable: "#5fa3b6",
          drawing: "#d8c48f",
          due: "#d08a3c",
          parched: "#8f3b1b",
        },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
