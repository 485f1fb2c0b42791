"use client";

import { useState } from "react";
import { signOut } from "./credentials";

export function SignOutButton() {
  const [pending, setPending] = useState(false);
  return (
    <button
      type="button"
      disabled={pending}
      onClick={async () => {
        setPending(true);
        await signOut().catch(() => undefined);
        window.location.assign("/");
      }}
      className="rounded-card border border-ink/30 px-3 py-1 text-sm font-semibold hover:bg-paper-deep"
    >
      Sign out
    </button>
  );
}
