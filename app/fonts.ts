import localFont from "next/font/local";

// Shipped with the app (no downloads): Source Sans 3 for the interface, Bitter (a slab serif with a
// shop-sign character) for page titles and the wordmark. Both SIL Open Font License.
export const sans = localFont({
  src: "../node_modules/@fontsource-variable/source-sans-3/files/source-sans-3-latin-wght-normal.woff2",
  variable: "--font-sans",
  weight: "200 900",
  display: "swap",
});

export const display = localFont({
  src: "../node_modules/@fontsource-variable/bitter/files/bitter-latin-wght-normal.woff2",
  variable: "--font-display",
  weight: "100 900",
  display: "swap",
});
