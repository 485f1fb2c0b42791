/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // The engraving library is browser-only and large; keep it out of server bundles.
  serverExternalPackages: ["pg", "smtp-server", "mailparser", "formidable"],
  outputFileTracingRoot: import.meta.dirname,
  turbopack: { root: import.meta.dirname },
};
export default nextConfig;
