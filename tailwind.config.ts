import type { Config } from "tailwindcss";

// Tailwind 4 reads design tokens from `@theme` in app/globals.css; this file names the sources and the dark mode.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  darkMode: "class",
};

export default config;
