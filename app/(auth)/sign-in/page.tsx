import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { ActionForm, Field } from "@/components/ui/action-form";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { getCurrentUser } from "@/server/auth/session";
import { safeCallbackPath } from "@/lib/http/safe-redirect";
import { requestSignInLinkAction } from "../actions";

export const metadata: Metadata = { title: "Sign in" };

type Search = Promise<Record<string, string | string[] | undefined>>;

const linkClass = "text-accent-strong underline";

export default async function SignInPage({ searchParams }: { searchParams: Search }) {
  const sp = await searchParams;
  const user = await getCurrentUser();
  const callbackUrl = safeCallbackPath(sp.callbackUrl, "");
  if (user) redirect(callbackUrl || (user.role === "admin" ? "/admin/users" : "/parts"));
  const email = typeof sp.email === "string" ? sp.email : undefined;
  const byLink = sp.method === "link";
  // The other way to sign in, keeping where to go afterwards and the address typed so far.
  const switchHref = `/sign-in?${new URLSearchParams({
    ...(byLink ? {} : { method: "link" }),
    ...(callbackUrl ? { callbackUrl } : {}),
    ...(email ? { email } : {}),
  })}`;
  return (
    <PageShell title="Sign in">
      {sp.reset ? <Notice>Your password is changed. Sign in with the new one.</Notice> : null}
      {sp.changed ? <Notice>Your password is changed and every session has ended. Sign in again.</Notice> : null}
      {sp.error ? <Notice tone="error">E-mail or password is wrong.</Notice> : null}
      {byLink ? (
        <Panel title="Sign in without your password" id="sign-in-link-heading">
          <p className="mb-4 text-graphite">
            Type the address of your account: we send it a link that signs you in without your password. The link works
            once and for 15 minutes.
          </p>
          <ActionForm action={requestSignInLinkAction} submitLabel="E-mail me a link" hidden={{ callbackUrl }}>
            <Field name="email" label="E-mail" type="email" autoComplete="email" required defaultValue={email} />
          </ActionForm>
        </Panel>
      ) : (
        <Panel>
          <SignInForm callbackUrl={callbackUrl || "/sign-in"} defaultEmail={email} />
        </Panel>
      )}
      <p className="flex flex-wrap items-center gap-3">
        <span className="text-graphite">{byLink ? "Know your password?" : "No password at hand?"}</span>
        <Link href={switchHref} className="rounded-card border border-ink/30 bg-paper-card px-4 py-2 font-semibold hover:bg-paper-deep">
          {byLink ? "Sign in with your password" : "E-mail me a sign-in link"}
        </Link>
      </p>
      <p className="text-graphite">
        <Link href="/forgot-password" className={linkClass}>Forgot your password?</Link>
        {" · "}
        <Link href={`/sign-up${callbackUrl ? `?callbackUrl=${encodeURIComponent(callbackUrl)}` : ""}`} className={linkClass}>Create an account</Link>
      </p>
    </PageShell>
  );
}
