import NextAuth from "next-auth";
import { authOptions } from "@/server/auth/options";
import { checkLimits, rateLimitError, signInChecks } from "@/server/auth/rate-limit";
import { linkUseChecks } from "@/server/auth/sign-in-link";
import { clientAddress } from "@/lib/http/client-address";

type Context = { params: Promise<{ nextauth: string[] }> };

export const dynamic = "force-dynamic";

export async function GET(request: Request, context: Context) {
  return NextAuth(authOptions())(request, context);
}

/**
 * Sign-in attempts are checked against the abuse limits before next-auth sees them, so a blocked
 * client gets 429 with Retry-After and a message naming when to try again. The attempt itself is
 * recorded by the provider's `authorize`, which knows whether it succeeded.
 */
export async function POST(request: Request, context: Context) {
  const { nextauth } = await context.params;
  if (nextauth?.[0] === "callback" && nextauth[1] === "credentials") {
    const email = await readEmail(request.clone());
    const limited = await checkLimits(signInChecks(email, clientAddress(request.headers)), "sign-in attempts");
    if (limited) return rateLimitError(limited).toResponse();
  }
  if (nextauth?.[0] === "callback" && nextauth[1] === "sign-in-link") {
    // Links are unguessable; the per-address limit still stops a client trying tokens in bulk.
    const limited = await checkLimits(linkUseChecks(clientAddress(request.headers)), "sign-in attempts");
    if (limited) return rateLimitError(limited).toResponse();
  }
  return NextAuth(authOptions())(request, context);
}

async function readEmail(request: Request): Promise<string> {
  try {
    const type = request.headers.get("content-type") ?? "";
    const body = type.includes("application/json")
      ? ((await request.json()) as Record<string, unknown>)
      : Object.fromEntries(new URLSearchParams(await request.text()));
    return String(body.email ?? "").trim().toLowerCase();
  } catch {
    return "";
  }
}
