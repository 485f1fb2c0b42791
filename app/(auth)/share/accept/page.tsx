import type { Metadata } from "next";
import Link from "next/link";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { AcceptInvitationButton } from "@/components/sharing/accept-invitation-button";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { getCurrentUser } from "@/server/auth/session";
import { acceptPath, lookUpInvitation } from "@/server/sharing";

export const metadata: Metadata = { title: "Shared part" };
export const dynamic = "force-dynamic";

type Search = Promise<Record<string, string | string[] | undefined>>;

const linkClass = "text-accent-strong underline";

/**
 * Opening an invitation link. Signed in with the invited address, the page offers a button that
 * accepts (a POST); otherwise it explains what to do. Opening the link (a GET) changes nothing,
 * and accepting needs both the token (proof of the mailbox) and the session of that address.
 */
export default async function AcceptSharePage({ searchParams }: { searchParams: Search }) {
  const sp = await searchParams;
  const token = typeof sp.token === "string" ? sp.token : "";
  if (!token) return <Message title="Invitation link incomplete">This link has no invitation in it. Open the whole link from the e-mail.</Message>;

  const user = await getCurrentUser();
  const found = await lookUpInvitation(token, user);
  const here = acceptPath(token);

  if (found.state === "invalid") return <Message title="Invitation not found">This invitation link is not valid. Check that you opened the whole link from the e-mail.</Message>;
  const { invitation } = found;
  const who = invitation.ownerName;
  const title = `“${invitation.partTitle}”`;
  if (found.state === "revoked") return <Message title="Invitation withdrawn">{who} has withdrawn this invitation to {title}.</Message>;
  if (found.state === "expired") return <Message title="Invitation expired">This invitation to {title} has expired. Ask {who} to send it again.</Message>;
  if (found.state === "used") {
    return found.byViewer ? (
      <Message title="Already accepted">
        You have already accepted this invitation. <Link className={linkClass} href={`/parts/${invitation.share.partId}`}>Open {title}</Link>.
      </Message>
    ) : (
      <Message title="Invitation already used">This invitation has already been used. If it was meant for you, ask {who} to invite you again.</Message>
    );
  }
  if (found.state === "own_part") return <Message title="Your own part">{title} is your own part; there is nothing to accept.</Message>;

  const email = invitation.share.email;
  if (!user) {
    const params = (path: string) => `${path}?${new URLSearchParams({ callbackUrl: here, email })}`;
    return (
      <PageShell title={`${who} shares ${title} with you`} lead={`The invitation is for ${email}.`}>
        <Panel>
          <p>Sign in with {email} to open the part, or create an account with that address if you have none yet. This link keeps working until you use it.</p>
          <p className="mt-4 flex flex-wrap gap-4">
            <Link className="rounded-card bg-accent-strong px-4 py-2 font-semibold text-paper" href={params("/sign-in")}>Sign in</Link>
            <Link className="rounded-card border border-ink/30 px-4 py-2 font-semibold" href={params("/sign-up")}>Create an account</Link>
          </p>
        </Panel>
      </PageShell>
    );
  }

  if (found.state === "wrong_account") {
    return (
      <PageShell title="This invitation is for another address">
        <Notice tone="error">
          This invitation to {title} was sent to {email}, but you are signed in as {user.email}. Nothing was accepted.
        </Notice>
        <Panel>
          <p>Sign out, then sign in (or create an account) with {email} and open the link again.</p>
          <div className="mt-4"><SignOutButton /></div>
        </Panel>
      </PageShell>
    );
  }

  return (
    <PageShell title={`${who} shares ${title} with you`} lead={`The invitation is for ${email}.`}>
      <Panel>
        <p className="mb-4">Accept to open the part; it then stays in your Parts.</p>
        <AcceptInvitationButton token={token} label="Accept and open the part" />
      </Panel>
    </PageShell>
  );
}

function Message({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <PageShell title={title}>
      <Notice tone="error">{children}</Notice>
      <p><Link className={linkClass} href="/parts">Go to your parts</Link></p>
    </PageShell>
  );
}
