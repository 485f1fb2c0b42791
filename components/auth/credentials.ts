/**
 * Browser side of next-auth's standard endpoints: fetch the CSRF token, then post the form.
 * Written out (rather than next-auth/react's signIn) so a 429 from the abuse limit reaches the
 * form with its message.
 */
export type SignInResult = { ok: true; url: string } | { ok: false; message: string };

async function csrfToken(): Promise<string> {
  const res = await fetch("/api/auth/csrf", { cache: "no-store" });
  return ((await res.json()) as { csrfToken: string }).csrfToken;
}

export async function signInWithPassword(email: string, password: string, callbackUrl: string): Promise<SignInResult> {
  const body = new URLSearchParams({ email, password, callbackUrl, csrfToken: await csrfToken(), json: "true" });
  const res = await fetch("/api/auth/callback/credentials", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body,
  });
  const data = (await res.json().catch(() => ({}))) as { url?: string; message?: string };
  if (res.status === 429) return { ok: false, message: data.message ?? "Too many attempts. Try again later." };
  if (!res.ok || !data.url || new URL(data.url, location.href).searchParams.has("error")) {
    return { ok: false, message: "E-mail or password is wrong." };
  }
  return { ok: true, url: data.url };
}

export async function signOut(): Promise<void> {
  await fetch("/api/auth/signout", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken: await csrfToken(), json: "true" }),
  });
}
