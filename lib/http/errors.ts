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
  console.error(`[${where}] unexpected error:`, error);
  return { status: 500, body: { code: "unavailable:internal", message: "Something went wrong on our side. Try again." } };
}
