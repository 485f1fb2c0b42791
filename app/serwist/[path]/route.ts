import { createSerwistRoute } from "@serwist/turbopack";

// The stand view's service worker (worker/sw.ts), bundled at build time and served from this
// origin as /serwist/sw.js. Nothing is precached: the stand view keeps what it loaded once opened.
export const { dynamic, dynamicParams, revalidate, generateStaticParams, GET } = createSerwistRoute({
  swSrc: "worker/sw.ts",
  useNativeEsbuild: true,
  globPatterns: [],
  esbuildOptions: { sourcemap: false },
});
