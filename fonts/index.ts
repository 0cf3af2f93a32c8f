import localFont from "next/font/local";

// Shipped with the repository (SIL OFL 1.1, see LICENSE-*.txt): nothing is fetched at build or run time.
export const sans = localFont({
  src: [
    { path: "./public-sans-latin-wght-normal.woff2", weight: "100 900", style: "normal" },
    { path: "./public-sans-latin-wght-italic.woff2", weight: "100 900", style: "italic" },
  ],
  variable: "--font-sans",
  display: "swap",
});

// Tabular figures for every number, unit and application number.
export const mono = localFont({
  src: [{ path: "./jetbrains-mono-latin-wght-normal.woff2", weight: "100 800", style: "normal" }],
  variable: "--font-mono",
  display: "swap",
});
