import type { Metadata } from "next";
import type { ReactNode } from "react";
import { Providers } from "./providers";
import "./globals.css";

export const metadata: Metadata = {
  title: "Teardown Ledger",
  description: "A team's shared repository of traced mains-gadget teardowns, with computed circuit annotations.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body>
        <header className="site-header">
          <a href="/" className="brand">
            Teardown Ledger
          </a>
          <nav>
            <a href="/">Entries</a>
            <a href="/api/health">Status</a>
          </nav>
        </header>
        <Providers>
          <main>{children}</main>
        </Providers>
      </body>
    </html>
  );
}
