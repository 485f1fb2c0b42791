/** The e-mails Ondula sends: plain text plus a simple HTML body, links built from APP_URL. */
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

export function compose({ subject, greeting, lines, action, after }: {
  subject: string;
  greeting: string;
  lines: string[];
  action: { label: string; url: string };
  after: string;
}): MailContent {
  const text = [greeting, "", ...lines, "", `${action.label}: ${action.url}`, "", after, "", "— Ondula"].join("\n");
  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;background:#FBF8F1;color:#1B1A17;padding:24px">
<p>${escapeHtml(greeting)}</p>
${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join("\n")}
<p><a href="${escapeHtml(action.url)}" style="color:#005A8C;font-weight:bold">${escapeHtml(action.label)}</a></p>
<p style="color:#4A4740">${escapeHtml(after)}</p>
<p style="color:#4A4740">— Ondula</p>
</body></html>`;
  return { subject, text, html };
}

export function verifyEmailMail({ name, url }: { name: string; url: string }): MailContent {
  return compose({
    subject: "Confirm your e-mail address for Ondula",
    greeting: `Hello ${name},`,
    lines: ["Please confirm that this address belongs to you. The link works once and for 48 hours."],
    action: { label: "Confirm my e-mail address", url },
    after: "If you did not create an Ondula account, ignore this message.",
  });
}

export function accountExistsMail({ name, url }: { name: string; url: string }): MailContent {
  return compose({
    subject: "Someone tried to create an Ondula account with your address",
    greeting: `Hello ${name},`,
    lines: ["Someone tried to create a new Ondula account with this address, which already has one. Nothing was changed."],
    action: { label: "Sign in or reset your password", url },
    after: "If it was you, sign in with your account instead. If it was not, you can ignore this message.",
  });
}

export function resetPasswordMail({ name, url }: { name: string; url: string }): MailContent {
  return compose({
    subject: "Reset your Ondula password",
    greeting: `Hello ${name},`,
    lines: ["Someone asked to reset the password of your Ondula account. The link works once and for 1 hour."],
    action: { label: "Choose a new password", url },
    after: "If it was not you, ignore this message: your password stays as it is.",
  });
}

export function signInLinkMail({ name, url }: { name: string; url: string }): MailContent {
  return compose({
    subject: "Your Ondula sign-in link",
    greeting: `Hello ${name},`,
    lines: [
      "Someone asked for a link to sign in to your Ondula account without a password. The link works once and for 15 minutes.",
      "Opening it shows a button; you are signed in only when you press it.",
    ],
    action: { label: "Sign in to Ondula", url },
    after: "If it was not you, ignore this message: nobody can sign in without the link, and it expires on its own.",
  });
}

export function studioInviteMail({ teacherName, studioName, url }: { teacherName: string; studioName: string; url: string }): MailContent {
  return compose({
    subject: `${teacherName} invites you to their Ondula studio`,
    greeting: "Hello,",
    lines: [
      `${teacherName} invites you to join "${studioName}" on Ondula, where you can share your marked parts with them.`,
      "Sign in, or create an account, with this e-mail address to join. The link works for 14 days.",
    ],
    action: { label: "Join the studio", url },
    after: "If you do not know this teacher, ignore this message.",
  });
}

export function appLink(appUrl: string, path: string, params: Record<string, string> = {}): string {
  const url = new URL(path, appUrl);
  for (const [k, v] of Object.entries(params)) url.searchParams.set(k, v);
  return url.toString();
}
