import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import "./globals.css";
import { sans, serif } from "./fonts";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { SiteHeader } from "@/components/ui/site-header";
import { Providers } from "@/components/providers";
import { getCurrentUser } from "@/server/auth/session";
import { resendVerificationAction } from "./(auth)/actions";

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

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request: its scripts carry the nonce of that request's
  // Content-Security-Policy (proxy.ts), which a page prerendered at build time could not.
  await connection();
  // The header must never take a page down: without the database it shows the signed-out links.
  const user = await getCurrentUser().catch(() => null);
  return (
    <html lang="en" className={`${sans.variable} ${serif.variable}`}>
      <body className="min-h-screen bg-paper text-ink antialiased">
        <Providers>
          <SiteHeader user={user} signOutButton={<SignOutButton />} resendVerificationAction={resendVerificationAction} />
          <main id="main">{children}</main>
        </Providers>
      </body>
    </html>
  );
}
