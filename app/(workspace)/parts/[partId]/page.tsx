import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { loadPart, partDto } from "@/lib/server/parts";
import { Workspace } from "@/components/score/workspace";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Workspace" };

export default async function PartWorkspacePage({ params }: { params: Promise<{ partId: string }> }) {
  const { partId } = await params;
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=/parts/${encodeURIComponent(partId)}`);
  if (!/^[0-9a-f-]{36}$/i.test(partId)) notFound();
  try {
    const access = await loadPart(user, partId, "part:view");
    return <Workspace partId={partId} initialPart={partDto(access)} />;
  } catch (err) {
    if (err instanceof AppError && (err.status === 404 || err.status === 403)) notFound();
    throw err;
  }
}
