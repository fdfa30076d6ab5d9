import type { Metadata } from "next";
import type { ReactNode } from "react";
import "@fontsource-variable/inter";
import "./globals.css";
import { TopBar } from "./components/TopBar";

export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: { default: "Heatbook", template: "%s · Heatbook" },
  description: "Low-temperature specific heat of metals, from raw C(T) curves to reviewed γ, β and ΘD.",
  icons: { icon: "/favicon.svg" },
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body>
        <a className="skip-link" href="#content">Skip to content</a>
        <TopBar />
        <main id="content">{children}</main>
        <footer className="footer">
          <div className="footer-inner">
            <span data-testid="review-disclaimer">Results need expert review before use in safety-relevant decisions; follow local practice.</span>
            <span>Heatbook — specific heat of metals at low temperature</span>
          </div>
        </footer>
      </body>
    </html>
  );
}
