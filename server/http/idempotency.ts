import "server-only";
import { createHash } from "node:crypto";
import {
  claimIdempotencyKey, deleteExpiredIdempotencyKeys, getIdempotencyKey, releaseIdempotencyKey, saveIdempotentAnswer,
  type IdempotencyScope,
} from "@/db/idempotency";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import { JSON_BODY_MAX_BYTES, readCappedBytes } from "@/lib/http/request-guards";

export const IDEMPOTENCY_HEADER = "Idempotency-Key";
/** A day, as most payment and messaging APIs keep theirs: long enough for any client's retries. */
export const IDEMPOTENCY_TTL_MS = 24 * 3600_000;
/** How long a first request may run before a copy may take the key over (it crashed, or its server stopped). */
const LEASE_MS = 2 * 60_000;
/** How long a copy waits for the first request's answer before it asks the client to try later. */
const WAIT_MS = 20_000;
const KEY_SHAPE = /^[\x21-\x7e]{8,255}$/;

/**
 * Runs a request that creates something at most once per `Idempotency-Key` (per user and route):
 * the first request claims the key in one statement, and a retry or a concurrent copy with the
 * same key gets the first answer (same status and body) instead of creating again — a copy that
 * arrives while the first still runs waits for its answer. The same key with a different request
 * answers 422. Only a success is kept: a refusal or a failure frees the key, so a retry runs
 * again. Without the header the request simply runs.
 *
 * The body is read here (with the route's cap) to fingerprint it, and `run` gets a request that
 * carries the same bytes.
 */
export async function idempotent(
  request: Request,
  user: Pick<CurrentUser, "id">,
  run: (request: Request) => Promise<Response>,
  { maxBytes = JSON_BODY_MAX_BYTES, tooLarge }: { maxBytes?: number; tooLarge?: (maxBytes: number) => AppError } = {},
): Promise<Response> {
  const key = request.headers.get(IDEMPOTENCY_HEADER);
  if (key === null) return run(request);
  if (!KEY_SHAPE.test(key)) {
    throw new AppError("bad_request:idempotency_key", "The Idempotency-Key header must be 8 to 255 visible ASCII characters (a random UUID is best).", { field: IDEMPOTENCY_HEADER });
  }
  const bytes = await readCappedBytes(request, maxBytes, tooLarge);
  const url = new URL(request.url);
  const scope: IdempotencyScope = { userId: user.id, route: `${request.method} ${url.pathname}`, key };
  const fingerprint = fingerprintOf(request, url, bytes);

  if (Math.random() < 0.01) void deleteExpiredIdempotencyKeys().catch(() => undefined);
  const deadline = Date.now() + WAIT_MS;
  while (!(await claimIdempotencyKey({ ...scope, fingerprint, leaseMs: LEASE_MS, ttlMs: IDEMPOTENCY_TTL_MS }))) {
    const held = await getIdempotencyKey(scope);
    if (!held) continue; // freed by a failed first request meanwhile: claim it again
    if (held.fingerprint !== fingerprint) {
      throw new AppError(
        "unprocessable:idempotency_key",
        "This Idempotency-Key was already used for a different request. Send a new key for each new action; reuse a key only to retry the same request.",
        { field: IDEMPOTENCY_HEADER },
      );
    }
    if (held.status !== null) return replay(held.status, held.body ?? "", held.contentType);
    if (Date.now() > deadline) {
      throw new AppError("conflict:idempotency_in_progress", "The same request is still being handled. Wait a moment, then reload to see whether it was saved.", {
        headers: { "Retry-After": "5" },
      });
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }

  let response: Response;
  try {
    response = await run(new Request(request.url, { method: request.method, headers: request.headers, body: bytes.byteLength ? bytes : undefined }));
  } catch (error) {
    await releaseIdempotencyKey(scope).catch(() => undefined);
    throw error;
  }
  if (response.status < 200 || response.status >= 300) {
    await releaseIdempotencyKey(scope).catch(() => undefined);
    return response;
  }
  const body = await response.text();
  const contentType = response.headers.get("content-type");
  try {
    await saveIdempotentAnswer({ ...scope, status: response.status, body, contentType });
  } catch (error) {
    // The thing was created: answer it. The key stays claimed until its lease ends.
    console.error("[idempotency] could not keep the answer:", (error as Error).message);
  }
  return new Response(body, { status: response.status, headers: response.headers });
}

function replay(status: number, body: string, contentType: string | null): Response {
  return new Response(body, { status, headers: { ...(contentType ? { "content-type": contentType } : {}), "Idempotent-Replayed": "true" } });
}

/**
 * What makes two requests the same: method, path and query, content type and body. A multipart
 * body is compared without its boundary, which a browser draws afresh for every send of a form.
 */
function fingerprintOf(request: Request, url: URL, bytes: Uint8Array): string {
  const contentType = request.headers.get("content-type") ?? "";
  const type = contentType.split(";")[0].trim().toLowerCase();
  const boundary = /boundary="?([^";]+)"?/i.exec(contentType)?.[1];
  const hash = createHash("sha256").update(`${request.method}\n${url.pathname}${url.search}\n${type}\n`);
  if (type === "multipart/form-data" && boundary) hash.update(Buffer.from(bytes).toString("latin1").split(boundary).join(""), "latin1");
  else hash.update(bytes);
  return hash.digest("hex");
}
