import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getUserByEmail } from "@/db/users";
import { config, isProduction } from "@/lib/config";
import { clientAddress } from "@/lib/http/client-address";
import { safeCallbackPath } from "@/lib/http/safe-redirect";
import { bumpSessionEpoch } from "@/db/users";
import { verifyPassword } from "@/lib/auth/password";
import { recordAttempt } from "./rate-limit";
import { linkUseChecks, signInWithLink } from "./sign-in-link";

/** A bcrypt hash of a random string: comparing against it keeps timing equal for unknown accounts. */
const DUMMY_HASH = "$2b$10$Qd90rXyM/0bQOk9wvpgzt.AsnvksRY3dP3zG9YvwIsySjiCPH5cZu";

export const SESSION_MAX_AGE = 30 * 24 * 3600;

let cached: NextAuthOptions | undefined;

/**
 * next-auth options, built on first use so that `next build` needs no secrets.
 * Sessions are JWTs carrying only the user id and the account's session epoch; everything else
 * (role, status, name) is re-read from the database on each request by `getCurrentUser`.
 * Unconfirmed e-mail addresses may sign in (they see a banner and cannot send invitations);
 * disabled accounts may not. The attempt is counted (and the limit checked) before next-auth runs, in the route.
 */
export function authOptions(): NextAuthOptions {
  if (cached) return cached;
  const cfg = config();
  cached = {
    secret: cfg.AUTH_SECRET,
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE },
    // Secure cookies (and the __Secure-/__Host- prefixes) in production; HttpOnly and
    // SameSite=Lax are next-auth's defaults for every cookie it sets.
    useSecureCookies: isProduction(),
    pages: { signIn: "/sign-in", error: "/sign-in" },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: {
          email: { label: "E-mail", type: "email" },
          password: { label: "Password", type: "password" },
        },
        async authorize(credentials) {
          const email = String(credentials?.email ?? "").trim().toLowerCase();
          const password = String(credentials?.password ?? "");
          if (!email || !password || email.length > 320 || password.length > 200) return null;
          const user = await getUserByEmail({ email });
          const passwordOk = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
          const ok = !!user && passwordOk && user.status === "active";
          // The attempt was counted before this comparison, by the route (consumeAttempt).
          if (!ok) return null;
          return { id: user.id, email: user.email, name: user.name, epoch: user.sessionEpoch };
        },
      }),
      // The e-mailed sign-in link: the link page posts its token here (never a GET, so a mail
      // scanner fetching the link cannot use it). The session is the same JWT as a password's.
      CredentialsProvider({
        id: "sign-in-link",
        name: "E-mailed sign-in link",
        credentials: { token: { label: "Token", type: "text" } },
        async authorize(credentials, req) {
          const address = clientAddress((req?.headers ?? {}) as Record<string, string>);
          const user = await signInWithLink({ token: String(credentials?.token ?? "") });
          await recordAttempt(linkUseChecks(address), !!user);
          return user;
        },
      }),
    ],
    events: {
      // Signing out ends the session on the server too: a copied cookie stops working, and so
      // do the account's sessions on other devices (one epoch per account).
      async signOut({ token }) {
        const userId = (token as { sub?: string } | null)?.sub;
        if (userId && /^[0-9a-f-]{36}$/i.test(userId)) await bumpSessionEpoch({ userId });
      },
    },
    callbacks: {
      async jwt({ token, user }) {
        if (user) {
          token.sub = user.id;
          token.epoch = (user as { epoch?: number }).epoch ?? 0;
        }
        return token;
      },
      async session({ session, token }) {
        return { ...session, userId: token.sub, epoch: token.epoch } as typeof session;
      },
      async redirect({ url, baseUrl }) {
        // Only same-origin destinations after sign-in and sign-out, resolved as a browser would.
        const path = safeCallbackPath(url.startsWith(baseUrl) ? url.slice(baseUrl.length) || "/" : url, "/", baseUrl);
        return `${baseUrl}${path}`;
      },
    },
  };
  return cached;
}

declare module "next-auth/jwt" {
  interface JWT {
    epoch?: number;
  }
}
