/**
 * One error vocabulary across the wire: a code like `not_found:part`, a message a person can act
 * on, and the HTTP status derived from the code's kind.
 */
export type ErrorKind =
  | "bad_request"
  | "unauthorized"
  | "forbidden"
  | "not_found"
  | "conflict"
  | "too_large"
  | "unprocessable"
  | "unsupported"
  | "rate_limited"
  | "quota"
  | "unavailable";

const STATUS: Record<ErrorKind, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unprocessable: 422,
  unsupported: 415,
  rate_limited: 429,
  quota: 403,
  unavailable: 503,
};

export type ErrorCode = `${ErrorKind}:${string}`;

export interface ErrorBody {
  code: ErrorCode;
  message: string;
  field?: string;
  details?: unknown;
  /** On a conflict, the resource as it is now, so the client can show it beside the refused change. */
  current?: unknown;
  /** Other state sent with a conflict (e.g. the proposal that just went stale). */
  [state: string]: unknown;
}

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly extra: {
      field?: string;
      details?: unknown;
      /**
       * A conflict's state as it is now (`current`: the resource the refused change was made
       * against), sent beside the code so the client can show both and let the person choose.
       */
      state?: { current: unknown } & Record<string, unknown>;
      headers?: Record<string, string>;
    } = {},
  ) {
    super(message);
    this.name = "AppError";
  }

  get status(): number {
    return STATUS[this.code.split(":")[0] as ErrorKind] ?? 400;
  }

  toBody(): ErrorBody {
    return { ...this.extra.state, code: this.code, message: this.message, field: this.extra.field, details: this.extra.details };
  }

  toResponse(): Response {
    return Response.json(this.toBody(), { status: this.status, headers: this.extra.headers });
  }
}
