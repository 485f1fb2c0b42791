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
  static fromAnswer(status: number, body: (Partial<ErrorBody> & Record<string, unknown>) | null | undefined): ApiError {
    return new ApiError(status, body?.code ?? `http:${status}`, body?.message ?? answerMessage(status), body?.field, body ?? undefined);
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
    throw ApiError.fromAnswer(response.status, body);
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

export const partUrl = (partId: string) => `/api/parts/${encodeURIComponent(partId)}`;
