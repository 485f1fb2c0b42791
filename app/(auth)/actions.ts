"use server";

import { after } from "next/server";
import { z } from "zod";
import {
  requestPasswordReset, resetPassword, sendVerification, signUp, verifyEmail,
} from "@/server/accounts/registration";
import { newPasswordSchema } from "@/lib/auth/password-rules";
import { admitSignInLinkRequest, sendSignInLink, SIGN_IN_LINK_SENT } from "@/server/auth/sign-in-link";
import { startSession } from "@/server/auth/start-session";
import { admitVerificationResend } from "@/server/auth/mail-limits";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/server/http/action";
import { clientAddress } from "@/lib/http/client-address";
import { safeCallbackPath } from "@/lib/http/safe-redirect";

const email = z.string().trim().min(1, "Enter your e-mail address.").max(320).email("Enter a valid e-mail address.");

export const signUpAction = defineAction({
  name: "signUp",
  auth: "optional",
  keep: ["name", "email", "role"],
  schema: z.object({
    name: z.string().trim().min(1, "Enter your name.").max(80, "Use at most 80 characters."),
    email,
    password: newPasswordSchema,
    role: z.enum(["player", "teacher"], { message: "Choose player or teacher." }),
    callbackUrl: z.string().optional(),
  }),
  run: async ({ input }) => {
    // The same answer whether or not the address already has an account; the mail goes after it.
    const user = await signUp(input);
    after(() => user.mail().catch((error) => console.error("[signUp] mail failed:", error)));
    // A new account is signed in at once. A taken address changes nothing and its owner is told by
    // mail; the answer is the same redirect either way (without a session, the page asks to sign in).
    if (user.created) await startSession(user.created);
    const target = safeCallbackPath(input.callbackUrl);
    return { redirectTo: `${target}${target.includes("?") ? "&" : "?"}welcome=1` };
  },
});

export const verifyEmailAction = defineAction({
  name: "verifyEmail",
  auth: "optional",
  schema: z.object({ token: z.string().min(1).max(200) }),
  run: async ({ input }) => {
    if (!(await verifyEmail({ token: input.token }))) {
      throw new AppError("bad_request:token", "This confirmation link is not valid any more. Sign in and ask for a new one.");
    }
    return { message: "Your e-mail address is confirmed." };
  },
});

export const resendVerificationAction = defineAction({
  name: "resendVerification",
  schema: z.object({}),
  run: async ({ user }) => {
    if (user.emailVerified) return { message: "Your e-mail address is already confirmed." };
    await admitVerificationResend(user);
    await sendVerification({ userId: user.id, email: user.email, name: user.name });
    return { message: `We sent a new link to ${user.email}.` };
  },
});

export const forgotPasswordAction = defineAction({
  name: "forgotPassword",
  auth: "optional",
  keep: ["email"],
  schema: z.object({ email }),
  run: async ({ input, headers }) => {
    const request = await requestPasswordReset({ email: input.email, address: clientAddress(headers) });
    after(() => request.mail().catch((error) => console.error("[forgotPassword] mail failed:", error)));
    return { message: "If an account uses this address, we sent it a link to choose a new password. The link works for 1 hour." };
  },
});

export const resetPasswordAction = defineAction({
  name: "resetPassword",
  auth: "optional",
  schema: z
    .object({ token: z.string().min(1).max(200), password: newPasswordSchema, confirm: z.string() })
    .refine((v) => v.password === v.confirm, { message: "The two passwords differ.", path: ["confirm"] }),
  run: async ({ input }) => {
    await resetPassword({ token: input.token, password: input.password });
    return { redirectTo: "/sign-in?reset=1" };
  },
});

export const requestSignInLinkAction = defineAction({
  name: "requestSignInLink",
  auth: "optional",
  keep: ["email"],
  schema: z.object({ email, callbackUrl: z.string().max(2000).optional() }),
  run: async ({ input, headers }) => {
    await admitSignInLinkRequest({ email: input.email, address: clientAddress(headers) });
    const callbackUrl = safeCallbackPath(input.callbackUrl, "");
    // Looking the account up and mailing happen after the answer, so the answer takes as long
    // whether or not the address has an account (no enumeration by timing either).
    after(() =>
      sendSignInLink({ email: input.email, callbackUrl }).catch((error) => {
        console.error("sign-in link not sent", error);
      }),
    );
    return { message: SIGN_IN_LINK_SENT };
  },
});
