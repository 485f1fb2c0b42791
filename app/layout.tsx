import type { Metadata } from "next";
import { connection } from "next/server";
import "./globals.css";
import { sans, serif } from "./fonts";
import { SiteHeader } from "@/components/ui/site-header";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Ondula", template: "%s · Ondula" },
  description: "Mark, practise and share vibrato and phrase decisions, note by note.",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request: its scripts carry the nonce of that request's
  // Content-Security-Policy (proxy.ts), which a page prerendered at build time could not.
  await connection();
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
