import "server-only";
import { cookies } from "next/headers";
import { encode } from "next-auth/jwt";
import { config, isProduction } from "@/lib/config";
import { SESSION_MAX_AGE } from "./options";

/**
 * Signs a new account in from a server action (sign-up): the same JWT next-auth writes after a
 * password sign-in (subject and session epoch, encrypted with AUTH_SECRET by next-auth's own
 * `encode`), in the cookie next-auth reads, with its attributes.
 */
export async function startSession(user: { id: string; name: string; email: string; sessionEpoch: number }): Promise<void> {
  const secure = isProduction();
  const token = await encode({
    token: { sub: user.id, name: user.name, email: user.email, epoch: user.sessionEpoch },
    secret: config().AUTH_SECRET,
    maxAge: SESSION_MAX_AGE,
  });
  (await cookies()).set(`${secure ? "__Secure-" : ""}next-auth.session-token`, token, {
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    secure,
    maxAge: SESSION_MAX_AGE,
  });
}
