import localFont from "next/font/local";

// Shipped in fonts/ (woff2 from the @fontsource-variable packages, SIL OFL); nothing is
// downloaded at build time. Atkinson Hyperlegible was drawn for low-vision readers —
// it suits a phone read at arm's length on a wet floor.
export const bodyFont = localFont({
  src: "../../fonts/atkinson-hyperlegible-next-latin-wght-normal.woff2",
  variable: "--font-body",
  weight: "200 800",
  display: "swap",
});

export const displayFont = localFont({
  src: "../../fonts/bricolage-grotesque-latin-wght-normal.woff2",
  variable: "--font-display",
  weight: "200 800",
  display: "swap",
});

export const codeFont = localFont({
  src: "../../fonts/atkinson-hyperlegible-mono-latin-wght-normal.woff2",
  variable: "--font-code",
  weight: "200 800",
  display: "swap",
});
