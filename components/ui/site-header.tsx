import Link from "next/link";
import { ActionForm } from "@/components/ui/action-form";
import type { ActionState } from "@/lib/http/action-state";
import type { CurrentUser } from "@/lib/auth/types";

const ROLE_LABEL = { player: "Player", teacher: "Teacher", admin: "Admin" } as const;

/**
 * Who is signed in and their role, the links their role may use, and sign-out. The root layout
 * resolves the session and hands over the sign-out button and the server action that sends the
 * confirmation again (a shared piece imports no feature and no route).
 */
export function SiteHeader({
  user,
  signOutButton,
  resendVerificationAction,
}: {
  user: CurrentUser | null;
  signOutButton: React.ReactNode;
  resendVerificationAction: (state: ActionState, form: FormData) => Promise<ActionState>;
}) {
  return (
    <header className="no-print border-b border-rule bg-paper">
      <nav aria-label="Main" className="flex flex-wrap items-center gap-x-6 gap-y-2 px-gutter py-3">
        <Link href="/" className="font-serif text-xl font-semibold tracking-tight">
          Ondula
        </Link>
        {user && user.role !== "admin" ? (
          <>
            <Link href="/parts" className="text-graphite hover:text-ink">Parts</Link>
            <Link href="/studio" className="text-graphite hover:text-ink">Studio</Link>
          </>
        ) : null}
        {user?.role === "admin" ? <Link href="/admin/users" className="text-graphite hover:text-ink">Accounts</Link> : null}
        <span className="ml-auto" />
        {user ? (
          <>
            <span className="text-sm" data-testid="signed-in-as">
              <span className="sr-only">Signed in as </span>
              <Link href="/settings" className="font-semibold hover:underline">{user.name}</Link>
              <span className="ml-2 rounded-full border border-graphite/50 px-2 py-0.5 text-xs uppercase tracking-wide text-graphite">
                {ROLE_LABEL[user.role]}
              </span>
            </span>
            {signOutButton}
          </>
        ) : (
          <>
            <Link href="/sign-in" className="text-graphite hover:text-ink">Sign in</Link>
            <Link href="/sign-up" className="text-graphite hover:text-ink">Sign up</Link>
          </>
        )}
      </nav>
      {user && !user.emailVerified ? (
        <div className="border-t border-rule bg-paper-deep">
          <div className="flex flex-wrap items-center gap-3 px-gutter py-2 text-sm">
            <p>Confirm your e-mail address: we sent a link to <strong>{user.email}</strong>.</p>
            <ActionForm action={resendVerificationAction} inline variant="quiet" submitLabel="Send it again" />
          </div>
        </div>
      ) : null}
    </header>
  );
}
