"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { signInWithLinkToken } from "./credentials";

/**
 * The one button that uses a sign-in link (a POST; opening the link only showed this page).
 * When the link is refused the page is rendered again, and it then says why.
 */
export function SignInLinkButton({ token, email, callbackUrl }: { token: string; email: string; callbackUrl: string }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function onClick() {
    setPending(true);
    setError(null);
    try {
      const result = await signInWithLinkToken(token, callbackUrl);
      if (result.ok) {
        // A full load, so the server renders the header and pages for the new session.
        window.location.assign(result.url);
        return;
      }
      setError(result.message);
      if (!result.limited) router.refresh();
    } catch {
      setError("Could not reach the server. Check your connection and try again.");
    }
    setPending(false);
  }

  return (
    <div className="grid gap-3">
      <button
        type="button"
        onClick={onClick}
        disabled={pending}
        aria-disabled={pending}
        className="justify-self-start rounded-card bg-accent px-4 py-2 font-semibold text-white hover:bg-accent-strong disabled:opacity-60"
      >
        {pending ? "Signing in…" : `Sign in as ${email}`}
      </button>
      <div role="alert" aria-live="assertive">
        {error ? <p className="text-sm font-semibold text-danger">{error}</p> : null}
      </div>
    </div>
  );
}
