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

/** Posts fields to a credentials provider's callback; `limited` carries the abuse limit's message. */
async function postCredentials(
  providerId: string,
  fields: Record<string, string>,
  callbackUrl: string,
): Promise<{ ok: true; url: string } | { ok: false; limited?: string }> {
  const body = new URLSearchParams({ ...fields, callbackUrl, csrfToken: await csrfToken(), json: "true" });
  const res = await fetch(`/api/auth/callback/${providerId}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body,
  });
  const data = (await res.json().catch(() => ({}))) as { url?: string; message?: string };
  if (res.status === 429) return { ok: false, limited: data.message ?? "Too many attempts. Try again later." };
  if (!res.ok || !data.url || new URL(data.url, location.href).searchParams.has("error")) return { ok: false };
  return { ok: true, url: data.url };
}

export async function signInWithPassword(email: string, password: string, callbackUrl: string): Promise<SignInResult> {
  const result = await postCredentials("credentials", { email, password }, callbackUrl);
  if (result.ok) return result;
  return { ok: false, message: result.limited ?? "E-mail or password is wrong." };
}

/**
 * Uses an e-mailed sign-in link. A refusal carries no reason: the link page, reloaded, says
 * whether the link was used, expired or its account disabled.
 */
export async function signInWithLinkToken(token: string, callbackUrl: string): Promise<SignInResult & { limited?: boolean }> {
  const result = await postCredentials("sign-in-link", { token }, callbackUrl);
  if (result.ok) return result;
  if (result.limited) return { ok: false, limited: true, message: result.limited };
  return { ok: false, message: "This link did not sign you in." };
}

export async function signOut(): Promise<void> {
  await fetch("/api/auth/signout", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken: await csrfToken(), json: "true" }),
  });
}
