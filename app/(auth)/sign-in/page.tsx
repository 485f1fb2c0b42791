import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { getCurrentUser } from "@/lib/auth/session";
import { safeCallbackPath } from "@/lib/http/safe-redirect";

export const metadata: Metadata = { title: "Sign in" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function SignInPage({ searchParams }: { searchParams: Search }) {
  const sp = await searchParams;
  const user = await getCurrentUser();
  const callbackUrl = safeCallbackPath(sp.callbackUrl, "");
  if (user) redirect(callbackUrl || (user.role === "admin" ? "/admin/users" : "/parts"));
  const email = typeof sp.email === "string" ? sp.email : undefined;
  return (
    <PageShell title="Sign in">
      {sp.registered ? <Notice>Your account is ready. We sent a link to {email ?? "your address"} to confirm it; you can sign in now.</Notice> : null}
      {sp.reset ? <Notice>Your password is changed. Sign in with the new one.</Notice> : null}
      {sp.changed ? <Notice>Your password is changed and every session has ended. Sign in again.</Notice> : null}
      {sp.error ? <Notice tone="error">E-mail or password is wrong.</Notice> : null}
      <Panel>
        <SignInForm callbackUrl={callbackUrl || "/sign-in"} defaultEmail={email} />
      </Panel>
      <p className="text-graphite">
        <Link href="/forgot-password" className="text-accent-strong underline">Forgot your password?</Link>
        {" · "}
        <Link href={`/sign-up${callbackUrl ? `?callbackUrl=${encodeURIComponent(callbackUrl)}` : ""}`} className="text-accent-strong underline">Create an account</Link>
      </p>
    </PageShell>
  );
}
