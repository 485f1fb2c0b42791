import "server-only";
import { z } from "zod";
import { AppError } from "@/lib/errors";

type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler: AppError → its status and `{ code, message, field }`; a zod error →
 * 400 naming the field; anything else → 500 with a generic message (logged, never leaked).
 */
export function handle<P = Record<string, string>>(
  fn: (request: Request, context: RouteContext<P>) => Promise<Response>,
): (request: Request, context: RouteContext<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      return await fn(request, context);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function errorResponse(err: unknown): Response {
  if (err instanceof AppError) return err.toResponse();
  if (err instanceof z.ZodError) return zodToAppError(err).toResponse();
  console.error("[api] unexpected error:", err);
  return Response.json(
    { code: "unavailable:server", message: "Something went wrong on our side. Nothing you sent was lost; try again." },
    { status: 500 },
  );
}

export function zodToAppError(err: z.ZodError): AppError {
  const issue = err.issues[0];
  const field = issue?.path.join(".") || undefined;
  const message = issue ? (field ? `${field}: ${issue.message}` : issue.message) : "The request is not valid.";
  return new AppError("bad_request:validation", message, { field });
}

/** Parses the JSON body with the route's schema; a malformed body is a 400 that says so. */
export async function parseJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new AppError("bad_request:json", "The request body must be JSON.");
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw zodToAppError(parsed.error);
  return parsed.data;
}

export async function parseParams<S extends z.ZodType>(params: Promise<unknown>, schema: S): Promise<z.infer<S>> {
  const parsed = schema.safeParse(await params);
  if (!parsed.success) throw zodToAppError(parsed.error);
  return parsed.data;
}

export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.infer<S> {
  const url = new URL(request.url);
  const parsed = schema.safeParse(Object.fromEntries(url.searchParams));
  if (!parsed.success) throw zodToAppError(parsed.error);
  return parsed.data;
}
