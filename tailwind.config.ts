import type { Config } from "tailwindcss";

/**
 * Ohmstead's palette: a deep slate-teal ground ("fen"), a warm copper accent for
 * action and emphasis, and a verdigris green and signal red kept for pass/fail.
 */
export default {
  theme: {
    extend: {
      colors: {
        fen: {
          50: "#f2f6f6",
          100: "#dfe9e9",
          200: "#bfd3d3",
          300: "#93b4b5",
          400: "#628d8f",
          500: "#467174",
          600: "#375a5d",
          700: "#2e4a4d",
          800: "#263d40",
          900: "#1b2c2f",
          950: "#0f1a1c",
        },
        copper: {
          50: "#fdf5ef",
          100: "#f9e6d7",
          200: "#f2caae",
          300: "#e9a77c",
          400: "#df7f4c",
          500: "#d6622b",
          600: "#c24d21",
          700: "#a13b1d",
          800: "#82311e",
          900: "#692a1b",
        },
        verdigris: { 50: "#eefbf5", 100: "#d5f5e6", 500: "#2f9e6f", 600: "#218058", 700: "#1c6648" },
        signal: { 50: "#fdf1f1", 100: "#fbdcdc", 500: "#d23a3a", 600: "#b52a2a", 700: "#942424" },
        amberline: { 50: "#fdf8ea", 100: "#faedc5", 500: "#c98d0b", 700: "#8a5d06" },
      },
    },
  },
} satisfies Config;
