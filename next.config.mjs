import { withSerwist } from "@serwist/turbopack";

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // The engraving library is browser-only and large; keep it out of server bundles.
  serverExternalPackages: ["pg", "smtp-server", "mailparser", "formidable"],
  outputFileTracingRoot: import.meta.dirname,
  turbopack: { root: import.meta.dirname },
};
// Serwist bundles the stand view's service worker with esbuild, kept out of the server bundles.
export default withSerwist(nextConfig);
