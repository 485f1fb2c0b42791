/**
 * The response headers every answer carries, and the Content-Security-Policy for pages.
 * Pure (no Next.js, no server-only): proxy.ts and next.config.mjs both read it.
 *
 * Pages get a fresh nonce per request (proxy.ts); Next.js puts it on its own inline scripts.
 * No 'unsafe-eval' outside `next dev`: the engraver (OpenSheetMusicDisplay) draws SVG through the
 * DOM and needs none. `blob:` in script-src is for the practice recorder's AudioWorklet, which is
 * loaded from a Blob URL (worklets follow script-src). Styles allow 'unsafe-inline' because the
 * engraver and React set style attributes on SVG elements; styles cannot run script.
 */
export function pageCsp(nonce: string, { dev = false }: { dev?: boolean } = {}): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' blob:${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "media-src 'self' blob:",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** API answers are data, never documents: nothing may load from them or frame them. */
export const API_CSP = "default-src 'none'; frame-ancestors 'none'; sandbox";

/** A stored file handed back for download: no script, no plugins, no framing even if opened. */
export const DOWNLOAD_CSP = "default-src 'none'; sandbox; frame-ancestors 'none'";
