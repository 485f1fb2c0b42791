import { z } from "zod";
import { AppError, type ErrorBody } from "@/lib/errors";

/** The first zod issue as a field name and a message a person can act on. */
export function zodIssue(error: z.ZodError): { field?: string; message: string } {
  const issue = error.issues[0];
  const field = issue?.path.map(String).join(".") || undefined;
  return { field, message: issue?.message ?? "Invalid input." };
}

/** Field name → first message, for forms that show every error next to its field. */
export function zodFieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "_form";
    out[key] ??= issue.message;
  }
  return out;
}

/** AppError, zod error or anything else → the wire body and status. Unknown errors are logged. */
export function toErrorBody(error: unknown, where: string): { status: number; body: ErrorBody; headers?: Record<string, string> } {
  if (error instanceof AppError) {
    return { status: error.status, body: error.toBody(), headers: error.extra.headers };
  }
  if (error instanceof z.ZodError) {
    const { field, message } = zodIssue(error);
    return { status: 400, body: { code: "bad_request:validation", message: field ? `${field}: ${message}` : message, field } };
  }
  if (isDatabaseUnreachable(error)) {
    console.error(`[${where}] database unreachable:`, (error as Error).message);
    return {
      status: 503,
      body: { code: "unavailable:database", message: "Ondula cannot reach its database for a moment. Nothing was changed; try again in a few seconds." },
      headers: { "Retry-After": "2" },
    };
  }
  console.error(`[${where}] unexpected error:`, error);
  return { status: 500, body: { code: "unavailable:internal", message: "Something went wrong on our side. Try again." } };
}

// PostgreSQL classes 08 (connection exception) and 57P0x (shutdown, cannot connect now), and the
// socket errors node-postgres surfaces while the server restarts.
const UNREACHABLE_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ENOTFOUND", "EAI_AGAIN", "57P01", "57P02", "57P03"]);
const UNREACHABLE_MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|the database system is (starting up|shutting down)|terminating connection due to administrator command/i;

/** True when the error (or one it wraps, as Drizzle does) says the database cannot be reached. */
export function isDatabaseUnreachable(error: unknown): boolean {
  for (let e = error, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && (UNREACHABLE_CODES.has(code) || code.startsWith("08"))) return true;
    const message = (e as { message?: unknown }).message;
    if (typeof message === "string" && UNREACHABLE_MESSAGES.test(message)) return true;
    if (e instanceof AggregateError && e.errors.some((inner) => isDatabaseUnreachable(inner))) return true;
  }
  return false;
}
