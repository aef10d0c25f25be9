import type { Config } from "tailwindcss";

// Hank & Lot tokens, named after the trade (see DEVELOPERS.md "Look"). Text pairs meet WCAG AA:
// pepper/brine on salt, white on paprika/smoke, each status ink on its own soft tint.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        salt: { DEFAULT: "#FAF7F2", deep: "#F1ECE4", edge: "#E4DDD2" },
        brine: { DEFAULT: "#56646F", line: "#C9D1D8", soft: "#E8EDF0" },
        pepper: { DEFAULT: "#1F1A17", soft: "#3A332E" },
        smoke: { DEFAULT: "#2A2623", raised: "#3A3531", text: "#E9E2D8", muted: "#B9AFA3" },
        paprika: { DEFAULT: "#AE3F1A", hover: "#923312", soft: "#F8E4DA" },
        // the pink the trade dyes curing salt: ONLY for curing salts and their hazard
        cure: { DEFAULT: "#A8225A", soft: "#FBE4EE", edge: "#E9A9C4" },
        herb: { DEFAULT: "#2E6A3A", soft: "#E2F0E1" },
        amber: { DEFAULT: "#845400", soft: "#FBEDCB" },
        ember: { DEFAULT: "#B0261E", soft: "#FBE1DE" },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
        display: ["var(--font-display)", "Georgia", "serif"],
      },
      minHeight: { touch: "44px" },
      minWidth: { touch: "44px" },
    },
  },
  plugins: [],
};

export default config;
