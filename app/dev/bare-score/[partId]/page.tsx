import { notFound, redirect } from "next/navigation";
import { BareScore } from "@/components/score/bare-score";
import { getCurrentUser } from "@/server/auth/session";
import { config } from "@/lib/config";
import { selectPartsXml } from "@/lib/musicxml";
import { loadPart } from "@/server/parts";

export const dynamic = "force-dynamic";

/** Development and test only: a part engraved with nothing of ours, the workspace benchmark's baseline. */
export default async function BareScorePage({ params }: { params: Promise<{ partId: string }> }) {
  if (config().APP_ENV === "production") notFound();
  const { partId } = await params;
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  const access = await loadPart(user, partId, "part:view").catch(() => null);
  if (!access) notFound();
  return <BareScore xml={selectPartsXml(access.part.musicxml, [access.part.chosenPartId])} />;
}
