import type { Metadata } from "next";
import Link from "next/link";
import { ActionForm } from "@/components/ui/action-form";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { viewInvitation } from "@/server/accounts/studio";
import { getCurrentUser } from "@/server/auth/session";
import { joinStudioAction } from "../actions";

export const metadata: Metadata = { title: "Join a studio" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function JoinStudioPage({ searchParams }: { searchParams: Search }) {
  const token = (await searchParams).token;
  const inv = typeof token === "string" && token.length <= 200 ? await viewInvitation({ token }) : { state: "invalid" as const };
  if (inv.state !== "open") {
    return (
      <PageShell title="Join a studio">
        <Notice tone="error">
          {inv.state === "used" ? "This invitation has been used already." : inv.state === "expired" ? "This invitation has expired. Ask your teacher for a new one." : "This invitation link is not valid."}
        </Notice>
      </PageShell>
    );
  }
  const user = await getCurrentUser();
  const here = `/studio/join?token=${encodeURIComponent(token as string)}`;
  const matches = user && user.email.toLowerCase() === inv.email.toLowerCase();
  return (
    <PageShell title={`Join ${inv.studioName}`} lead={<>{inv.teacherName} invited <strong>{inv.email}</strong>.</>}>
      {!user ? (
        <Panel>
          <p className="mb-4">Sign in, or create an account, with {inv.email} to join.</p>
          <p className="flex flex-wrap gap-3">
            <Link href={`/sign-in?${new URLSearchParams({ callbackUrl: here, email: inv.email })}`} className="rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong">Sign in</Link>
            <Link href={`/sign-up?${new URLSearchParams({ callbackUrl: here, email: inv.email })}`} className="rounded-card border border-ink/30 px-4 py-2 font-semibold hover:bg-paper-deep">Create an account</Link>
          </p>
        </Panel>
      ) : !matches ? (
        <Panel>
          <Notice tone="error">
            This invitation was sent to {inv.email}, but you are signed in as {user.email}. Sign out and sign in (or sign up) with {inv.email} to join.
          </Notice>
          <div className="mt-4"><SignOutButton /></div>
        </Panel>
      ) : (
        <Panel>
          <ActionForm action={joinStudioAction} submitLabel={`Join ${inv.studioName}`} hidden={{ token: token as string }} />
        </Panel>
      )}
    </PageShell>
  );
}
