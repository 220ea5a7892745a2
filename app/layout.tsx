import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import type { ReactNode } from "react";
// Fonts ship with the app (npm packages), so nothing is fetched from a font service at build or run time.
import "@fontsource-variable/public-sans";
import "@fontsource-variable/jetbrains-mono";
import "./globals.css";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Strutroom", template: "%s · Strutroom" },
  description: "The shared review board for steel space-truss roofs.",
  // The icons and the web manifest live in public/ (drawn from components/brand/mark.tsx).
  manifest: "/manifest.webmanifest",
  icons: { icon: [{ url: "/favicon.ico", sizes: "32x32" }, { url: "/icon.svg", type: "image/svg+xml" }], apple: "/apple-touch-icon.png" },
};

export const viewport: Viewport = { themeColor: "#0f766e" };

export default async function RootLayout({ children }: { children: ReactNode }) {
  // Every page renders per request: the Content-Security-Policy nonce (proxy.ts) is new each time, and Next can
  // only put it on the scripts of a page it renders then.
  await connection();
  return (
    <html lang="en-GB">
      <body className="min-h-screen">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
