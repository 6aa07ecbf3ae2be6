import localFont from "next/font/local";

// Shipped with the app from the @fontsource packages: nothing is fetched at build or run time.
export const sans = localFont({
  src: [
    { path: "../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff2", weight: "700", style: "normal" },
    { path: "../node_modules/@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-italic.woff2", weight: "400", style: "italic" },
  ],
  variable: "--font-sans",
  display: "swap",
});

export const mono = localFont({
  src: [{ path: "../node_modules/@fontsource/ibm-plex-mono/files/ibm-plex-mono-latin-400-normal.woff2", weight: "400" }],
  variable: "--font-mono",
  display: "swap",
});
