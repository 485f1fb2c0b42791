import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/server/parts";
import { listMarkingsByPartId } from "@/db/markings";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:view");
  return Response.json({ markings: await listMarkingsByPartId({ partId }) });
});
