import "server-only";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { toErrorBody } from "./errors";

type Params = Record<string, string | string[] | undefined>;
type Context = { params: Promise<Params> };

/**
 * Wraps a route handler: AppError → its status and `{ code, message, field }`, zod errors →
 * 400 naming the field, anything else → 500 with a generic message (and the error logged).
 * Next.js's own control-flow errors (notFound, redirect) are rethrown untouched.
 */
export function handle<C extends Context = Context>(fn: (request: Request, context: C) => Promise<Response>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      return await fn(request, context);
    } catch (error) {
      if (isNextControlFlow(error)) throw error;
      const { status, body, headers } = toErrorBody(error, `${request.method} ${new URL(request.url).pathname}`);
      return Response.json(body, { status, headers });
    }
  };
}

function isNextControlFlow(error: unknown): boolean {
  const digest = (error as { digest?: unknown } | null)?.digest;
  return typeof digest === "string" && (digest.startsWith("NEXT_") || digest === "DYNAMIC_SERVER_USAGE");
}

/** Reads and validates a JSON body; malformed JSON is a 400 like any other bad input. */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  let data: unknown;
  try {
    data = await request.json();
  } catch {
    throw new AppError("bad_request:json", "The request body is not valid JSON.");
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
