import fs from "node:fs/promises";
import path from "node:path";
import { handle, parseJson } from "@/lib/http/handler";
import { assertCan } from "@/lib/auth/policy";
import { requireUser } from "@/server/auth/session";
import { AppError } from "@/lib/errors";
import { sampleBody } from "@/lib/parts/schemas";
import { createPartFromFile } from "@/server/parts";
import { idempotent } from "@/server/http/idempotency";

export const dynamic = "force-dynamic";

const samplesDir = () => path.join(process.cwd(), "samples");

async function sampleNames(): Promise<string[]> {
  const names = await fs.readdir(samplesDir()).catch(() => []);
  return names.filter((n) => /\.(musicxml|mxl)$/.test(n)).sort();
}

/** Our own sample parts, for a new player with nothing to upload yet. */
export const GET = handle(async () => {
  await requireUser();
  return Response.json({ samples: await sampleNames() });
});

export const POST = handle(async (request) => {
  const user = await requireUser();
  assertCan(user, "part:create", { type: "site" });
  return idempotent(request, user, async (request) => {
    const { name } = await parseJson(request, sampleBody);
    if (!(await sampleNames()).includes(name)) throw new AppError("not_found:sample", `There is no sample called ${name}.`);
    const bytes = new Uint8Array(await fs.readFile(path.join(samplesDir(), name)));
    const { part, importedMarkings, unreadableMarkings } = await createPartFromFile(user, name, bytes);
    // The same answer as an upload, so the library treats both alike.
    return Response.json(
      { id: part.id, url: `/parts/${part.id}`, parts: part.partList, chosenPart: part.chosenPartId, importedMarkings, unreadableMarkings, notices: part.readNotices },
      { status: 201 },
    );
  });
});
