import type { Metadata } from "next";
import "./globals.css";
import { sans, serif } from "./fonts";
import { SiteHeader } from "@/components/ui/site-header";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Ondula", template: "%s · Ondula" },
  description: "Mark, practise and share vibrato and phrase decisions, note by note.",
};

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
