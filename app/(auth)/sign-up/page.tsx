import type { Metadata } from "next";
import Link from "next/link";
import { ActionForm, Field, RadioGroup } from "@/components/ui/action-form";
import { PageShell, Panel } from "@/components/ui/page-shell";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";
import { signUpAction } from "../actions";

export const metadata: Metadata = { title: "Create an account" };

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function SignUpPage({ searchParams }: { searchParams: Search }) {
  const sp = await searchParams;
  const callbackUrl = typeof sp.callbackUrl === "string" ? sp.callbackUrl : "";
  const email = typeof sp.email === "string" ? sp.email : undefined;
  return (
    <PageShell title="Create an account" lead="Players mark and practise their parts; teachers run a studio and work on their students' parts with them.">
      <Panel>
        <ActionForm action={signUpAction} submitLabel="Create account" hidden={callbackUrl ? { callbackUrl } : undefined}>
          <Field name="name" label="Name" autoComplete="name" required maxLength={80} />
          <Field name="email" label="E-mail" type="email" autoComplete="email" required defaultValue={email} />
          <Field name="password" label="Password" type="password" autoComplete="new-password" required
            hint={`At least ${PASSWORD_MIN_LENGTH} characters; common passwords are refused.`} />
          <RadioGroup name="role" legend="I am a" defaultValue="player" options={[
            { value: "player", label: "Player", hint: "I prepare parts and share them with my teacher." },
            { value: "teacher", label: "Teacher", hint: "I run a studio of students." },
          ]} />
        </ActionForm>
      </Panel>
      <p className="text-graphite">
        Already have an account? <Link href="/sign-in" className="text-accent-strong underline">Sign in</Link>
      </p>
    </PageShell>
  );
}
