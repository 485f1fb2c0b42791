import NextAuth from "next-auth";
import { NextRequest } from "next/server";
import { authOptions } from "@/server/auth/options";
import { checkLimits, consumeAttempt, markAttemptSucceeded, rateLimitError, signInChecks } from "@/server/auth/rate-limit";
import { linkUseChecks } from "@/server/auth/sign-in-link";
import { AppError } from "@/lib/errors";
import { clientAddress } from "@/lib/http/client-address";
import { readCappedText } from "@/lib/http/request-guards";
import { answerOutage } from "@/lib/http/handler";

type Context = { params: Promise<{ nextauth: string[] }> };

export const dynamic = "force-dynamic";

/** A sign-in or sign-out form is a few hundred bytes; anything much larger is refused unread. */
const AUTH_BODY_MAX_BYTES = 8 * 1024;

export const GET = answerOutage("auth GET", async (request: Request, context: Context) => NextAuth(authOptions())(request, context));

/**
 * The body is read once, with a byte cap, before anything parses it. Sign-in attempts are then
 * checked against the abuse limits before next-auth sees them, so a blocked client gets 429 with
 * Retry-After and a message naming when to try again. The attempt itself is recorded by the
 * provider's `authorize`, which knows whether it succeeded.
 */
export const POST = answerOutage("auth POST", async (request: Request, context: Context) => {
  let text: string;
  try {
    text = await readCappedText(request, AUTH_BODY_MAX_BYTES);
  } catch (error) {
    if (error instanceof AppError) return error.toResponse();
    throw error;
  }
  const { nextauth } = await context.params;
  if (nextauth?.[0] === "callback" && nextauth[1] === "credentials") {
    const email = readEmail(text, request.headers.get("content-type") ?? "");
    const attempt = await consumeAttempt(signInChecks(email, clientAddress(request.headers)), "sign-in attempts");
    if ("limited" in attempt) return rateLimitError(attempt.limited).toResponse();
    const response: Response = await NextAuth(authOptions())(replayOf(request, text), context);
    if (response.headers.getSetCookie().some((c) => /next-auth\.session-token=[^;]/.test(c))) await markAttemptSucceeded(attempt.attempt);
    return response;
  }
  if (nextauth?.[0] === "callback" && nextauth[1] === "sign-in-link") {
    // Links are unguessable; the per-address limit still stops a client trying tokens in bulk.
    const limited = await checkLimits(linkUseChecks(clientAddress(request.headers)), "sign-in attempts");
    if (limited) return rateLimitError(limited).toResponse();
  }
  return NextAuth(authOptions())(replayOf(request, text), context);
});

/** next-auth reads the body itself; it gets the capped text that was already read. */
function replayOf(request: Request, text: string): NextRequest {
  return new NextRequest(request.url, { method: "POST", headers: request.headers, body: text });
}

function readEmail(text: string, type: string): string {
  try {
    const body = type.includes("application/json") ? (JSON.parse(text) as Record<string, unknown>) : Object.fromEntries(new URLSearchParams(text));
    return String(body.email ?? "").trim().toLowerCase();
  } catch {
    return "";
  }
}
