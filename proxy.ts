import { NextResponse, type NextRequest } from "next/server";
import { API_CSP, pageCsp } from "@/lib/http/security-headers";

/**
 * Every page gets a Content-Security-Policy with a nonce of its own; Next.js reads the nonce from
 * the request's CSP header and puts it on the scripts it writes into the page. API answers get a
 * policy that forbids everything, since no browser should render them as documents.
 * The other security headers come from next.config.mjs and cover static files too.
 */
export function proxy(request: NextRequest) {
  if (request.nextUrl.pathname.startsWith("/api/")) {
    const response = NextResponse.next();
    response.headers.set("Content-Security-Policy", API_CSP);
    return response;
  }
  const nonce = btoa(crypto.randomUUID());
  const csp = pageCsp(nonce, { dev: process.env.NODE_ENV === "development" });
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("Content-Security-Policy", csp);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("Content-Security-Policy", csp);
  return response;
}

export const config = {
  matcher: [{ source: "/((?!_next/static|_next/image|favicon.ico).*)" }],
};
