import type { Metadata } from "next";
import Link from "next/link";
import { checkEmailLink } from "@/server/accounts/registration";
import { ActionForm } from "@/components/ui/action-form";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { verifyEmailAction } from "../actions";

export const metadata: Metadata = { title: "Confirm your e-mail address" };

type Search = Promise<Record<string, string | string[] | undefined>>;

/** Confirming takes a click: mail scanners that open links must not use the token up. */
export default async function VerifyEmailPage({ searchParams }: { searchParams: Search }) {
  const token = (await searchParams).token;
  const peek = await checkEmailLink("verify_email", token);
  return (
    <PageShell title="Confirm your e-mail address">
      {peek.state === "valid" ? (
        <Panel>
          <p className="mb-4">Confirm that <strong>{peek.email}</strong> is your address.</p>
          <ActionForm action={verifyEmailAction} submitLabel="Confirm my e-mail address" hidden={{ token: token as string }} />
        </Panel>
      ) : peek.state === "used" ? (
        <Notice>This link has been used already: the address is confirmed.</Notice>
      ) : (
        <Notice tone="error">
          This confirmation link is {peek.state === "expired" ? "expired" : "not valid"}. Sign in and ask for a new one from the banner at the top.
        </Notice>
      )}
      <p><Link href="/sign-in" className="text-accent-strong underline">Go to sign-in</Link></p>
    </PageShell>
  );
}
