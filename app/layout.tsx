import type { Metadata } from "next";
import { SiteHeader } from "@/components/shell/site-header";
import { inter, plexMono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Squarely", template: "%s · Squarely" },
  description: "A shared, machine-checked atlas of coarse-grainings between dynamical models.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${inter.variable} ${plexMono.variable}`}>
      <body className="flex min-h-screen flex-col">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-50 focus:rounded-md focus:bg-saffron-300 focus:px-3 focus:py-2 focus:text-tide-900">
          Skip to content
        </a>
        <SiteHeader />
        <main id="main" className="flex-1">
          {children}
        </main>
        <footer className="border-t border-line">
          <div className="mx-auto flex max-w-6xl flex-wrap justify-between gap-2 px-5 py-4 text-xs text-ink-faint">
            <span>Squarely — every square in the atlas is checked by machine.</span>
            <span className="font-mono">exact rationals · RFC 8785 certificates</span>
          </div>
        </footer>
      </body>
    </html>
  );
}
