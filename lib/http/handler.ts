import "server-only";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { isDatabaseUnreachable, toErrorBody } from "./errors";
import { JSON_BODY_MAX_BYTES, assertSameSiteWrite, readCappedText } from "./request-guards";

type Params = Record<string, string | string[] | undefined>;
type Context = { params: Promise<Params> };

/**
 * Wraps a route handler: AppError → its status and `{ code, message, field }`, zod errors →
 * 400 naming the field, anything else → 500 with a generic message (and the error logged).
 * Next.js's own control-flow errors (notFound, redirect) are rethrown untouched.
 * Before the handler runs, a state-changing request from another site is refused (request-guards).
 */
export function handle<C extends Context = Context>(fn: (request: Request, context: C) => Promise<Response>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      assertSameSiteWrite(request, process.env.APP_URL);
      return await fn(request, context);
    } catch (error) {
      if (isNextControlFlow(error)) throw error;
      const { status, body, headers } = toErrorBody(error, `${request.method} ${new URL(request.url).pathname}`);
      return Response.json(body, { status, headers });
    }
  };
}

/**
 * For a route that cannot go through `handle()` (next-auth's own, which takes form posts): a
 * database that cannot be reached still answers 503 with Retry-After, never 500.
 */
export function answerOutage<A extends unknown[]>(where: string, fn: (...args: A) => Promise<Response>) {
  return async (...args: A): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (error) {
      if (!isDatabaseUnreachable(error)) throw error;
      const { status, body, headers } = toErrorBody(error, where);
      return Response.json(body, { status, headers });
    }
  };
}

function isNextControlFlow(error: unknown): boolean {
  const digest = (error as { digest?: unknown } | null)?.digest;
  return typeof digest === "string" && (digest.startsWith("NEXT_") || digest === "DYNAMIC_SERVER_USAGE");
}

/**
 * Reads and validates a JSON body; malformed JSON is a 400 like any other bad input. The body is
 * streamed with a byte cap (413 past it) so a huge body is never held or parsed.
 */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S, { maxBytes = JSON_BODY_MAX_BYTES }: { maxBytes?: number } = {}): Promise<z.infer<S>> {
  const text = await readCappedText(request, maxBytes);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new AppError("bad_request:json", "The request body is not valid JSON.");
  }
  const field = controlCharacterField(data);
  if (field !== null) {
    throw new AppError("bad_request:control_character", `${field ? `${field}: ` : ""}The text contains an invisible control character. Remove it and try again.`, { field: field || undefined });
  }
  return schema.parse(data);
}

/** Validates route params (awaiting them, as Next.js 16 hands them over as a promise). */
export async function parseParams<S extends z.ZodType>(params: Promise<Params> | Params, schema: S): Promise<z.infer<S>> {
  return schema.parse(await params);
}

/** Validates the query string. */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.infer<S> {
  return schema.parse(Object.fromEntries(new URL(request.url).searchParams));
}

// Tab, line feed and carriage return are text; every other C0 control (NUL above all, which
// PostgreSQL refuses in text) and DEL are not.
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

/** The path of the first string (or key) holding a control character, or null when none does. */
export function controlCharacterField(value: unknown, path: string[] = []): string | null {
  if (typeof value === "string") return CONTROL.test(value) ? path.join(".") : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = controlCharacterField(value[i], [...path, String(i)]);
      if (found !== null) return found;
    }
    return null;
  }
  if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (CONTROL.test(k)) return path.join(".");
      const found = controlCharacterField(v, [...path, k]);
      if (found !== null) return found;
    }
  }
  return null;
}
