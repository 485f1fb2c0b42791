import type { ErrorBody } from "@/lib/errors";

/**
 * An error answer from our API, rebuilt on the client with the server's code (`not_found:part`,
 * `conflict:marking`…), its message, the field it names and, on a conflict, the resource as it is
 * now. `status` 0: the network did not answer.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
    readonly body?: Partial<ErrorBody> & Record<string, unknown>,
    /** How long the server asked us to wait before trying again (its `Retry-After`), if it said. */
    readonly retryAfterMs?: number,
  ) {
    super(message);
    this.name = "ApiError";
  }

  get isNetwork(): boolean {
    return this.status === 0;
  }

  get isConflict(): boolean {
    return this.status === 409;
  }

  /** On a conflict, the resource as the server holds it now (what the refused change would have overwritten). */
  get current(): unknown {
    return this.body?.current;
  }

  /** Worth sending again unchanged: no answer, the server busy or away (5xx, 408, 429). */
  get isTransient(): boolean {
    return this.isNetwork || this.status >= 500 || this.status === 408 || this.status === 429;
  }

  /**
   * What an engineer needs and a player does not: the error's code and its technical detail (an
   * element name, a value, the HTTP status), for a "Details" toggle beside the message.
   */
  get technical(): string {
    const details = this.body?.details as { technical?: unknown } | undefined;
    const detail = typeof details?.technical === "string" ? details.technical : null;
    return [`Code ${this.code}`, this.status ? `HTTP ${this.status}` : "no answer", detail].filter(Boolean).join(" · ");
  }

  /** An answer that is not ours (a proxy, a crash) still becomes an ApiError with a message a person can act on. */
  static fromAnswer(status: number, body: (Partial<ErrorBody> & Record<string, unknown>) | null | undefined, retryAfterMs?: number): ApiError {
    return new ApiError(status, body?.code ?? `http:${status}`, body?.message ?? answerMessage(status), body?.field, body ?? undefined, retryAfterMs);
  }
}

/** The message for an answer without our error body (from a proxy in front of Ondula, or a crash). */
export function answerMessage(status: number): string {
  if (status === 413) return "This file is larger than Ondula accepts. Upload the single part you play, or export it as a compressed .mxl file.";
  if (status === 429) return "Too many requests at once. Wait a minute, then try again.";
  if (status === 502 || status === 503 || status === 504) return "Ondula is not answering right now. Try again in a minute; nothing was lost.";
  if (status >= 500) return "Something went wrong on Ondula's side. Try again; nothing was lost.";
  return "Ondula could not do this. Reload the page and try again.";
}

export const NETWORK_MESSAGE = "Ondula cannot be reached. Check your connection; nothing was lost.";

async function send(url: string, init?: RequestInit): Promise<Response> {
  let response: Response;
  try {
    response = await fetch(url, { credentials: "same-origin", ...init });
  } catch {
    throw new ApiError(0, "unavailable:network", NETWORK_MESSAGE);
  }
  if (!response.ok) {
    // A proxy or a crash can answer without our JSON error shape.
    const body = await response.json().catch(() => null);
    throw ApiError.fromAnswer(response.status, body, parseRetryAfter(response.headers.get("retry-after")));
  }
  return response;
}

/** The one fetcher of the client: JSON in and out, an `ApiError` for any refusal. */
export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  const response = await send(url, {
    ...init,
    headers: { accept: "application/json", ...(typeof init?.body === "string" ? { "content-type": "application/json" } : {}), ...init?.headers },
  });
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

/** A request with a JSON body (none for `body === undefined`). */
export function jsonRequest(method: string, body?: unknown): RequestInit {
  return body === undefined ? { method } : { method, body: JSON.stringify(body) };
}

export async function fetchText(url: string, init?: RequestInit): Promise<string> {
  return (await send(url, init)).text();
}

/** Retry what may pass on a second try (no answer, 5xx); never a refusal or a conflict. */
export function retryTransient(failureCount: number, error: unknown): boolean {
  if (!(error instanceof ApiError)) return false;
  return (error.isNetwork || error.status >= 500) && failureCount < 4;
}

export const retryDelay = (attempt: number) => Math.min(500 * 2 ** attempt, 8000);

/** `Retry-After` as milliseconds: delay-seconds or an HTTP date (RFC 9110 §10.2.3); undefined when absent or unreadable. */
export function parseRetryAfter(value: string | null, now = Date.now()): number | undefined {
  if (!value) return undefined;
  const text = value.trim();
  if (/^\d+$/.test(text)) return Number(text) * 1000;
  const at = Date.parse(text);
  return Number.isNaN(at) ? undefined : Math.max(0, at - now);
}

/**
 * For a player's edits, which must never be dropped: every transient failure is retried, without
 * a limit, until the server takes the edit or refuses it (a 4xx, a conflict).
 */
export function retryUntilSaved(_failureCount: number, error: unknown): boolean {
  return error instanceof ApiError && error.isTransient;
}

/** The longest wait between two tries of an edit, so a returning server is noticed soon. */
export const SAVE_RETRY_MAX_MS = 10_000;

/**
 * Back-off for an edit's retries: 1 s, 2 s, 4 s… up to 10 s, with up to a quarter more at random
 * so a crowd of clients does not come back in step; at least what the server's `Retry-After`
 * asked for (up to a minute).
 */
export function saveRetryDelay(failureCount: number, error: unknown, random = Math.random): number {
  const backoff = Math.min(1000 * 2 ** failureCount, SAVE_RETRY_MAX_MS) * (1 + random() / 4);
  const asked = error instanceof ApiError && error.retryAfterMs !== undefined ? Math.min(error.retryAfterMs, 60_000) : 0;
  return Math.round(Math.max(backoff, asked));
}

export const partUrl = (partId: string) => `/api/parts/${encodeURIComponent(partId)}`;

/** The chosen part's MusicXML. */
export const musicXmlUrl = (partId: string) => `${partUrl(partId)}/musicxml`;
