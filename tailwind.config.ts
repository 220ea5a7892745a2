import type { Config } from "tailwindcss";

// Strutroom's own palette (../shared/glossary.md): force states first, then the calm neutrals of the board.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        tension: "#0f766e",
        compression: "#c2410c",
        zeroforce: "#94a3b8",
        selection: "#7c3aed",
        mep: "#0284c7",
        clash: "#e11d48",
        board: { 50: "#f7f8f6", 100: "#eef0ec", 200: "#dde1da", 700: "#3d4640", 800: "#262d29", 900: "#161b18" },
      },
      fontFamily: {
        sans: ["'Public Sans Variable'", "system-ui", "sans-serif"],
        mono: ["'JetBrains Mono Variable'", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
