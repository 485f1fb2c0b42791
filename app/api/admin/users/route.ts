import { z } from "zod";
import { USER_SORTS } from "@/lib/accounts/user-list";
import { listAccounts } from "@/server/accounts/admin";
import { getCurrentUser } from "@/server/auth/session";
import { handle, parseQuery } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

const userListQuery = z.object({
  q: z.string().max(200).default(""),
  sort: z.enum(USER_SORTS).default("created"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

/** Accounts for admins: search, sort and pages on the server. */
export const GET = handle(async (request) => {
  const input = parseQuery(request, userListQuery);
  const page = await listAccounts(await getCurrentUser(), { query: input.q, sort: input.sort, dir: input.dir, page: input.page, pageSize: input.pageSize });
  return Response.json(page, { headers: { "cache-control": "no-store" } });
});
