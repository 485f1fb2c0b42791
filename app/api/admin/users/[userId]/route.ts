import { z } from "zod";
import { changeRole, changeStatus } from "@/server/accounts/admin";
import { requireUser } from "@/server/auth/session";
import { ROLES } from "@/lib/auth/types";
import { handle, parseJson, parseParams } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

const params = z.object({ userId: z.string().uuid("Not a valid account id.") });
const body = z
  .object({ role: z.enum(ROLES).optional(), status: z.enum(["active", "disabled"]).optional() })
  .refine((b) => b.role !== undefined || b.status !== undefined, { message: "Give a role or a status.", path: ["role"] });

/** An admin changes an account's role or status; disabling ends its sessions at once. */
export const PATCH = handle(async (request, context: { params: Promise<{ userId: string }> }) => {
  const { userId } = await parseParams(context.params, params);
  const user = await requireUser();
  const input = await parseJson(request, body);
  if (input.role) await changeRole(user, { userId, role: input.role });
  if (input.status) await changeStatus(user, { userId, status: input.status });
  return Response.json({ id: userId, ...input });
});
