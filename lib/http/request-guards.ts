import { AppError } from "@/lib/errors";

/** JSON bodies larger than this are refused before they are parsed (markings, comments, takes are small). */
export const JSON_BODY_MAX_BYTES = 256 * 1024;

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

function tooLarge(maxBytes: number): AppError {
  return new AppError("too_large:body", `The request is larger than ${Math.round(maxBytes / 1024)} KB. Send less at once.`);
}

/**
 * Reads a body as text, refusing it as soon as it passes `maxBytes`: a declared Content-Length
 * over the cap is refused without reading, and a streamed (chunked) body is cut off at the cap.
 */
export async function readCappedText(request: Request, maxBytes = JSON_BODY_MAX_BYTES): Promise<string> {
  return new TextDecoder("utf-8", { fatal: false }).decode(await readCappedBytes(request, maxBytes));
}

/** The body's bytes, with the same cap as `readCappedText` (`tooLargeError` names what was too large). */
export async function readCappedBytes(request: Request, maxBytes = JSON_BODY_MAX_BYTES, tooLargeError: (maxBytes: number) => AppError = tooLarge): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(request.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLargeError(maxBytes);
  if (!request.body) return new Uint8Array();
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLargeError(maxBytes);
    }
    chunks.push(value);
  }
  return new Uint8Array(Buffer.concat(chunks));
}

function hasBody(request: Request): boolean {
  const length = request.headers.get("content-length");
  if (length !== null) return Number(length) > 0;
  return request.headers.has("transfer-encoding");
}

/** The origins a browser of ours sends: the configured app URL, and the host the request came to. */
function sameOrigin(origin: string, request: Request, appUrl: string | undefined): boolean {
  let o: URL;
  try {
    o = new URL(origin);
  } catch {
    return false;
  }
  if (appUrl) {
    try {
      if (new URL(appUrl).origin === o.origin) return true;
    } catch {
      /* a bad APP_URL is config's to report */
    }
  }
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
  return !!host && o.host === host;
}

/**
 * Refuses a state-changing request that a browser sent from another site (ASVS 4.2.2, 13.2.3):
 * its Origin must be ours (browsers always send Origin on cross-origin POST/PUT/PATCH/DELETE,
 * and Fetch Metadata names a cross-site request), and a body must be JSON or multipart — the
 * types a cross-site HTML form or a "simple" fetch cannot send without a CORS preflight, which
 * Ondula never grants. Non-browser clients that send no Origin pass on the content type alone.
 */
export function assertSameSiteWrite(request: Request, appUrl: string | undefined): void {
  if (SAFE_METHODS.has(request.method)) return;
  const origin = request.headers.get("origin");
  const site = request.headers.get("sec-fetch-site");
  if ((origin !== null && !sameOrigin(origin, request, appUrl)) || site === "cross-site" || site === "same-site") {
    throw new AppError("forbidden:cross_site", "This request came from another site and was refused. Use Ondula's own pages.");
  }
  if (!hasBody(request)) return;
  const type = (request.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
  if (type !== "application/json" && type !== "multipart/form-data") {
    throw new AppError("unsupported:content_type", "Send the request body as application/json (or multipart/form-data for files).");
  }
}
