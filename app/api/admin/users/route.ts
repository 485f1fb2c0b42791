import { z } from "zod";
import { USER_SORTS, listUsers } from "@/db/users";
import { assertCan } from "@/lib/auth/policy";
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
  assertCan(await getCurrentUser(), "admin:list_users", { type: "site" });
  const { rows, total } = await listUsers({ query: input.q, sort: input.sort, dir: input.dir, page: input.page, pageSize: input.pageSize });
  return Response.json({ rows, total, page: input.page, pageSize: input.pageSize }, { headers: { "cache-control": "no-store" } });
});
