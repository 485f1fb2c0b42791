import type { ErrorBody } from "@/lib/errors";

/** An error answer from our API, rebuilt on the client (`status` 0: the network did not answer). */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
    readonly body?: unknown,
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
}

async function send(url: string, init?: RequestInit): Promise<Response> {
  let response: Response;
  try {
    response = await fetch(url, { credentials: "same-origin", ...init });
  } catch {
    throw new ApiError(0, "unavailable:network", "The server could not be reached. Your change is kept and will be sent again.");
  }
  if (!response.ok) {
    let body: Partial<ErrorBody> & Record<string, unknown> = {};
    try {
      body = await response.json();
    } catch {
      // A proxy or a crash can answer without our JSON error shape.
    }
    throw new ApiError(
      response.status,
      body.code ?? `http:${response.status}`,
      body.message ?? `The server answered ${response.status}.`,
      body.field,
      body,
    );
  }
  return response;
}

export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  const response = await send(url, {
    ...init,
    headers: { accept: "application/json", ...(init?.body ? { "content-type": "application/json" } : {}), ...init?.headers },
  });
  return (await response.json()) as T;
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
