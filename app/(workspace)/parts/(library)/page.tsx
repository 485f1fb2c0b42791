import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/server/auth/session";
import { PartsTable } from "@/components/library/parts-table";
import { UploadPanel } from "@/components/library/upload-panel";

export const metadata: Metadata = { title: "Parts" };
export const dynamic = "force-dynamic";

export default async function PartsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await getCurrentUser();
  const welcome = (await searchParams).welcome === "1";
  if (!user) redirect("/sign-in?callbackUrl=/parts");
  return (
    <div className="mx-auto max-w-7xl px-gutter py-8">
      <h1 className="text-2xl font-semibold">Parts</h1>
      {welcome && user ? (
        <p className="mt-3 rounded-card border border-rule bg-paper-card px-4 py-3" role="status" data-testid="welcome">
          Welcome, {user.name}: you are signed in. Upload a MusicXML part (or open a sample) to begin; we sent a link to {user.email} to
          confirm your address.
        </p>
      ) : null}
      <div className="mt-6 grid gap-8 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <UploadPanel />
        <PartsTable />
      </div>
    </div>
  );
}
