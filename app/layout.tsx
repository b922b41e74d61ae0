import type { Metadata } from "next";
import localFont from "next/font/local";
import "./globals.css";

// Inter ships inside node_modules (@fontsource-variable/inter): no network at build or run time.
const sans = localFont({
  src: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2",
  weight: "100 900",
  style: "normal",
  display: "swap",
  variable: "--font-gusset-sans",
});

// Every page renders per request: proxy.ts gives each response a fresh script nonce, which Next stamps on
// the scripts it writes while rendering; a page prerendered at build time would carry none, and the
// Content-Security-Policy would block its scripts. (Pages read the session anyway; this covers the rest.)
export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: { default: "Gusset", template: "%s · Gusset" },
  description: "The firm's library of calculation standards.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={sans.variable}>
      <body className="min-h-dvh">{children}</body>
    </html>
  );
}
