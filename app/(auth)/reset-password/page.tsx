import type { Metadata } from "next";
import Link from "next/link";
import { checkEmailLink } from "@/server/accounts/registration";
import { ActionForm, Field } from "@/components/ui/action-form";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";
import { resetPasswordAction } from "../actions";

export const metadata: Metadata = { title: "Choose a new password" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function ResetPasswordPage({ searchParams }: { searchParams: Search }) {
  const token = (await searchParams).token;
  const peek = await checkEmailLink("reset_password", token);
  return (
    <PageShell title="Choose a new password">
      {peek.state === "valid" ? (
        <Panel>
          <ActionForm action={resetPasswordAction} submitLabel="Set the new password" hidden={{ token: token as string }}>
            <Field name="password" label="New password" type="password" autoComplete="new-password" required
              hint={`At least ${PASSWORD_MIN_LENGTH} characters; common passwords are refused.`} />
            <Field name="confirm" label="New password again" type="password" autoComplete="new-password" required />
          </ActionForm>
        </Panel>
      ) : (
        <Notice tone="error">
          This reset link is {peek.state === "used" ? "used already" : peek.state === "expired" ? "expired" : "not valid"}.{" "}
          <Link href="/forgot-password" className="underline">Ask for a new one</Link>.
        </Notice>
      )}
    </PageShell>
  );
}
