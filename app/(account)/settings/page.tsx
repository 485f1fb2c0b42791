import type { Metadata } from "next";
import { getProfile } from "@/server/accounts/profile";
import { ActionForm, Checkbox, Field } from "@/components/ui/action-form";
import { PageShell, Panel } from "@/components/ui/page-shell";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";
import { requirePageUser } from "@/server/auth/require-page-user";
import { resendVerificationAction } from "../../(auth)/actions";
import { changePasswordAction, updateProfileAction } from "./actions";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const user = await requirePageUser("/settings");
  const row = await getProfile(user);
  return (
    <PageShell title="Settings" lead={<>Signed in as <strong>{user.email}</strong> ({user.role}).</>}>
      <Panel title="Profile" id="profile">
        <ActionForm action={updateProfileAction} submitLabel="Save" successMessage="Saved.">
          <Field name="name" label="Name" autoComplete="name" defaultValue={row.name} required maxLength={80} />
          <Checkbox
            name="emailNotifications"
            label="Send me e-mail about activity on my parts and the parts shared with me"
            hint="New comments and replies, proposals and your answers to them (accepted or declined, with the reply), practice assignments from a teacher, and invitations accepted. At most one message per part every 10 minutes; everything also shows in Ondula's notifications."
            defaultChecked={row.emailNotifications}
          />
        </ActionForm>
      </Panel>
      <Panel title="E-mail address" id="email">
        {user.emailVerified ? (
          <p>{user.email} is confirmed.</p>
        ) : (
          <div className="grid gap-3">
            <p>{user.email} is not confirmed yet. Until it is, you cannot send invitations.</p>
            <ActionForm action={resendVerificationAction} submitLabel="Send the confirmation link again" variant="quiet" />
          </div>
        )}
      </Panel>
      <Panel title="Password" id="password">
        <ActionForm action={changePasswordAction} submitLabel="Change password">
          <Field name="current" label="Current password" type="password" autoComplete="current-password" required />
          <Field name="next" label="New password" type="password" autoComplete="new-password" required
            hint={`At least ${PASSWORD_MIN_LENGTH} characters; common passwords are refused. Changing it signs you out everywhere.`} />
          <Field name="confirm" label="New password again" type="password" autoComplete="new-password" required />
        </ActionForm>
      </Panel>
    </PageShell>
  );
}
