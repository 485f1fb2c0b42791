import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/lib/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/lib/server/parts";
import { listMarkingsByPartId } from "@/db/markings";

export const dynamic = "force-dynamic";

export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:view");
  return Response.json({ markings: await listMarkingsByPartId({ partId }) });
});
