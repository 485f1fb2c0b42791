import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { stepHistory } from "@/server/markings";

export const dynamic = "force-dynamic";

export const POST = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  return Response.json(await stepHistory(user, partId, "redo"));
});
