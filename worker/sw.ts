/**
 * The service worker behind the stand view's "offline once opened" (built by Serwist, served at
 * /serwist/sw.js, scope /parts/). It keeps only what a stand view needs: the stand pages (the page
 * carries the part's text and markings) and the build's hashed scripts, styles and fonts. Nothing
 * else passes through it, so the workspace and the API behave exactly as without it.
 */
import { CacheFirst, ExpirationPlugin, NetworkFirst, Serwist, type PrecacheEntry, type SerwistPlugin } from "serwist";
import { STAND_CACHE, STATIC_CACHE, isStandPath } from "@/lib/stand-view/offline";

declare const self: { __SW_MANIFEST: (PrecacheEntry | string)[] | undefined; location: Location };

/** A stand page is kept only as the signed-in page itself, never a redirect to sign-in or an error. */
const onlyThePage: SerwistPlugin = {
  cacheWillUpdate: async ({ response }) => (response.ok && !response.redirected ? response : null),
};

const sameOrigin = (url: URL) => url.origin === self.location.origin;

const serwist = new Serwist({
  precacheEntries: self.__SW_MANIFEST,
  skipWaiting: true,
  clientsClaim: true,
  navigationPreload: false,
  disableDevLogs: true,
  runtimeCaching: [
    {
      matcher: ({ url, request }) => request.method === "GET" && sameOrigin(url) && isStandPath(url.pathname),
      // The network first (a stand page shows the latest markings), the kept copy after 4 s or offline.
      handler: new NetworkFirst({
        cacheName: STAND_CACHE,
        networkTimeoutSeconds: 4,
        plugins: [onlyThePage, new ExpirationPlugin({ maxEntries: 40, maxAgeSeconds: 60 * 60 * 24 * 60 })],
      }),
    },
    {
      // Hashed file names: a kept file never changes.
      matcher: ({ url, request }) => request.method === "GET" && sameOrigin(url) && url.pathname.startsWith("/_next/static/"),
      handler: new CacheFirst({
        cacheName: STATIC_CACHE,
        plugins: [new ExpirationPlugin({ maxEntries: 300, maxAgeSeconds: 60 * 60 * 24 * 60 })],
      }),
    },
  ],
});

serwist.addEventListeners();
