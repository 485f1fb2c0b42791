import { handle, parseParams } from "@/lib/http/handler";
import { requireUser } from "@/server/auth/session";
import { partIdParams } from "@/lib/parts/schemas";
import { loadPart } from "@/server/parts";
import { summarizeThreadsByPartId } from "@/db/comments";
import { countOpenProposalsByPartId } from "@/db/proposals";

export const dynamic = "force-dynamic";

/** What the score's comment markers draw: per thread, live comments and open proposals. */
export const GET = handle(async (_request, { params }) => {
  const { partId } = await parseParams(params, partIdParams);
  const user = await requireUser();
  await loadPart(user, partId, "part:view");
  const [threads, proposals] = await Promise.all([summarizeThreadsByPartId({ partId }), countOpenProposalsByPartId({ partId })]);
  const byKey = new Map(threads.map((t) => [t.threadKey, { ...t, openProposals: 0 }]));
  for (const p of proposals) {
    const entry = byKey.get(p.noteKey) ?? { threadKey: p.noteKey, count: 0, unresolved: false, openProposals: 0 };
    entry.openProposals = p.count;
    byKey.set(p.noteKey, entry);
  }
  return Response.json({ threads: [...byKey.values()].sort((a, b) => a.threadKey.localeCompare(b.threadKey)) });
});
