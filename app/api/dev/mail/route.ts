import { z } from "zod";
import { AppError } from "@/lib/errors";
import { handle, parseQuery } from "@/lib/http/handler";
import { listCaughtMessages } from "@/lib/mail/mailbox";

export const dynamic = "force-dynamic";

const query = z.object({ to: z.string().email().optional() });

/** The local mailbox as JSON, newest first (development and test only; 404 in production). */
export const GET = handle(async (request) => {
  const { to } = parseQuery(request, query);
  const messages = await listCaughtMessages({ to });
  if (!messages) throw new AppError("not_found:page", "Not found.");
  return Response.json(
    messages.map(({ id, to, from, subject, text, links, date }) => ({ id, to, from, subject, text, links, date })),
    { headers: { "cache-control": "no-store" } },
  );
});
