import type { Metadata } from "next";
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
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
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
