/** What the stand view's service worker keeps, shared by the worker and the page. */

export const STAND_CACHE = "ondula-stand-pages";
export const STATIC_CACHE = "ondula-static";
export const WORKER_URL = "/serwist/sw.js";
export const WORKER_SCOPE = "/parts/";

/** `/parts/<id>/stand`, the only pages the worker keeps. */
export function isStandPath(pathname: string): boolean {
  return /^\/parts\/[^/]+\/stand\/?$/.test(pathname);
}

/** The files the page loaded that a reopened page needs again: same origin, hashed build files. */
export function filesToKeep(resourceUrls: readonly string[], origin: string): string[] {
  const out = new Set<string>();
  for (const raw of resourceUrls) {
    let url: URL;
    try {
      url = new URL(raw, origin);
    } catch {
      continue;
    }
    if (url.origin === origin && url.pathname.startsWith("/_next/static/")) out.add(url.origin + url.pathname + url.search);
  }
  return [...out];
}
