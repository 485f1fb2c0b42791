import type { Metadata } from "next";
import { ActionForm, Field } from "@/components/ui/action-form";
import { PageShell, Panel } from "@/components/ui/page-shell";
import { forgotPasswordAction } from "../actions";

export const metadata: Metadata = { title: "Forgot your password" };

export default function ForgotPasswordPage() {
  return (
    <PageShell title="Forgot your password" lead="Enter the address you signed up with; we send it a link to choose a new password.">
      <Panel>
        <ActionForm action={forgotPasswordAction} submitLabel="Send the link">
          <Field name="email" label="E-mail" type="email" autoComplete="email" required />
        </ActionForm>
      </Panel>
    </PageShell>
  );
}
