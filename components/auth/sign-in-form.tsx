"use client";

import { useId, useState, type FormEvent } from "react";
import { inputClass } from "@/components/ui/styles";
import { signInWithPassword } from "./credentials";

export function SignInForm({ callbackUrl, defaultEmail }: { callbackUrl: string; defaultEmail?: string }) {
  const id = useId();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setPending(true);
    setError(null);
    try {
      const result = await signInWithPassword(String(form.get("email")), String(form.get("password")), callbackUrl);
      if (result.ok) {
        // A full load, so the server renders the header and pages for the new session.
        window.location.assign(result.url);
        return;
      }
      setError(result.message);
    } catch {
      setError("Could not reach the server. Check your connection and try again.");
    }
    setPending(false);
  }

  return (
    <form onSubmit={onSubmit} className="grid gap-4" noValidate>
      <div className="grid gap-1">
        <label htmlFor={`${id}-email`} className="font-semibold">E-mail</label>
        <input id={`${id}-email`} name="email" type="email" autoComplete="email" required defaultValue={defaultEmail}
          aria-describedby={error ? `${id}-error` : undefined} className={inputClass} />
      </div>
      <div className="grid gap-1">
        <label htmlFor={`${id}-password`} className="font-semibold">Password</label>
        <input id={`${id}-password`} name="password" type="password" autoComplete="current-password" required
          aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} className={inputClass} />
      </div>
      <div role="alert" aria-live="assertive">
        {error ? <p id={`${id}-error`} className="text-sm font-semibold text-danger">{error}</p> : null}
      </div>
      <button type="submit" disabled={pending} className="justify-self-start rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong disabled:opacity-60">
        {pending ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
