import type { Metadata, Viewport } from "next";
import "./globals.css";
import { sans, serif } from "./fonts";
import { SiteHeader } from "@/components/ui/site-header";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Ondula", template: "%s · Ondula" },
  description: "Mark, practise and share vibrato and phrase decisions, note by note.",
  applicationName: "Ondula",
  manifest: "/manifest.webmanifest",
  icons: {
    icon: [{ url: "/favicon.ico", sizes: "16x16 32x32 48x48" }, { url: "/icon.svg", type: "image/svg+xml" }],
    apple: "/apple-touch-icon.png",
  },
};

/** The paper ground (tailwind.config.ts `paper`) tints the browser's bar and the home-screen splash. */
export const viewport: Viewport = { themeColor: "#FBF8F1" };

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${serif.variable}`}>
      <body className="min-h-screen bg-paper text-ink antialiased">
        <Providers>
          <SiteHeader />
          <main id="main">{children}</main>
        </Providers>
      </body>
    </html>
  );
}
