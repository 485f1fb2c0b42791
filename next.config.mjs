import { withSerwist } from "@serwist/turbopack";

/**
 * Sent on every response (pages, API, static files); the Content-Security-Policy is set per
 * request in proxy.ts (pages need a fresh nonce). microphone=(self): the practice page records
 * takes; nothing else of the browser's powerful features is used.
 */
const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "microphone=(self), camera=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=()" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // The engraving library is browser-only and large; keep it out of server bundles.
  serverExternalPackages: ["pg", "pg-boss", "smtp-server", "mailparser", "formidable", "rate-limiter-flexible"],
  outputFileTracingRoot: import.meta.dirname,
  turbopack: { root: import.meta.dirname },
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};
// Serwist bundles the stand view's service worker with esbuild, kept out of the server bundles.
export default withSerwist(nextConfig);
