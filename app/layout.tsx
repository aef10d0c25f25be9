import type { Metadata, Viewport } from "next";
import { display, sans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Hank & Lot", template: "%s · Hank & Lot" },
  description: "Casings, cures and spices across your kitchens.",
};

export const viewport: Viewport = { themeColor: "#2A2623", width: "device-width", initialScale: 1 };

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${display.variable}`}>
      <body>{children}</body>
    </html>
  );
}
