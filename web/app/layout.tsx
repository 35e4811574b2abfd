import type { Metadata } from "next";
import type { ReactNode } from "react";
import { SiteHeader } from "./components/site-header";
import { Providers } from "./providers";
import "./globals.css";

export const metadata: Metadata = {
  title: "Teardown Ledger",
  description:
    "A team's shared repository of traced mains-gadget teardowns, with computed circuit annotations.",
};

// The header shows who is signed in, so every page is rendered per request.
export const dynamic = "force-dynamic";

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body>
        <SiteHeader />
        <Providers>
          <main>{children}</main>
        </Providers>
        <footer className="site-footer">
          <span>Teardown Ledger</span>
          <a href="/api/health">Service status</a>
        </footer>
      </body>
    </html>
  );
}
