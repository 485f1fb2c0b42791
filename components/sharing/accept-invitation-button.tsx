"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/**
 * Accepting an invitation is a POST from this button, never the GET of the link: a mail scanner
 * or a prefetch that opens the link accepts nothing.
 */
export function AcceptInvitationButton({ token, label }: { token: string; label: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function accept() {
    setBusy(true);
    setError(null);
    try {
      const res = await fetch("/api/shares/accept", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ token }),
      });
      const body = (await res.json().catch(() => ({}))) as { url?: string; message?: string };
      if (!res.ok || !body.url) throw new Error(body.message ?? "The invitation could not be accepted. Try again.");
      router.push(`${body.url}?shared=1`);
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
      setBusy(false);
    }
  }
  return (
    <div>
      <button type="button" onClick={accept} disabled={busy}
        className="rounded-card bg-accent-strong px-4 py-2 font-semibold text-paper disabled:opacity-60">
        {busy ? "Accepting…" : label}
      </button>
      {error ? <p role="alert" className="mt-3 font-semibold text-danger">{error}</p> : null}
    </div>
  );
}
