import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { SignInLinkButton } from "@/components/auth/sign-in-link-button";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { getCurrentUser } from "@/server/auth/session";
import { lookUpSignInLink } from "@/server/auth/sign-in-link";

// The token is in this page's address: never send it on to another site.
export const metadata: Metadata = { title: "Sign in with your link", referrer: "no-referrer" };
export const dynamic = "force-dynamic";

type Search = Promise<Record<string, string | string[] | undefined>>;

const linkClass = "text-accent-strong underline";

/** Where to ask for a new link, with the address filled in. */
const newLinkHref = (email?: string) => `/sign-in?${new URLSearchParams({ method: "link", ...(email ? { email } : {}) })}`;

/**
 * Opening an e-mailed sign-in link. Opening it uses nothing (mail scanners fetch links); the
 * button posts the token to next-auth. A link that cannot sign in says why, with a way on.
 */
export default async function SignInLinkPage({ searchParams }: { searchParams: Search }) {
  const token = (await searchParams).token;
  const link = await lookUpSignInLink({ token });

  if (link.state === "valid") {
    return (
      <PageShell title="Sign in with your link">
        <Panel>
          <p className="mb-4">This link signs you in to Ondula as <strong>{link.email}</strong>. It works once, until {link.expiresAt.toISOString().slice(11, 16)} UTC.</p>
          <SignInLinkButton token={token as string} email={link.email} callbackUrl={link.destination} />
        </Panel>
        <p className="text-graphite">Not your address? Close this page; nothing happens until the button is pressed.</p>
      </PageShell>
    );
  }

  if (link.state === "used") {
    const user = await getCurrentUser();
    if (user?.id === link.userId) {
      return (
        <PageShell title="You are signed in">
          <Notice>
            This link has been used, and you are signed in as {link.email}. <Link className={linkClass} href={link.destination}>Continue</Link>.
          </Notice>
        </PageShell>
      );
    }
    return (
      <Outcome title="This sign-in link has been used" email={link.email}>
        Each sign-in link works once, and this one has been used already. Ask for a new link to sign in.
      </Outcome>
    );
  }
  if (link.state === "expired") {
    return (
      <Outcome title="This sign-in link has expired" email={link.email}>
        Sign-in links work for 15 minutes after they are sent, and this one is older. Ask for a new link to sign in.
      </Outcome>
    );
  }
  if (link.state === "disabled") {
    return (
      <Outcome title="This account is disabled">
        The account {link.email} is disabled, so it cannot sign in, with a link or a password. If you think this is a
        mistake, ask the person who runs your Ondula to enable it again.
      </Outcome>
    );
  }
  return (
    <Outcome title="This sign-in link is not valid" email="">
      Check that you opened the whole link from the e-mail. If it still does not work, ask for a new link.
    </Outcome>
  );
}

/**
 * A link that did not sign in: what happened, and the way on. `email` set (even empty) offers a
 * new link; a disabled account gets none, as it would not help.
 */
function Outcome({ title, email, children }: { title: string; email?: string; children: ReactNode }) {
  return (
    <PageShell title={title}>
      <Notice tone="error">{children}</Notice>
      <p className="flex flex-wrap gap-4">
        {email !== undefined ? (
          <Link className="rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong" href={newLinkHref(email)}>
            E-mail me a new link
          </Link>
        ) : null}
        <Link className="rounded-card border border-ink/30 px-4 py-2 font-semibold hover:bg-paper-deep" href="/sign-in">
          Sign in with a password
        </Link>
      </p>
    </PageShell>
  );
}
