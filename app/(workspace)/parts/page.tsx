import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/server/auth/session";
import { PartsTable } from "@/components/library/parts-table";
import { UploadPanel } from "@/components/library/upload-panel";

export const metadata: Metadata = { title: "Parts" };
export const dynamic = "force-dynamic";

export default async function PartsPage() {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in?callbackUrl=/parts");
  return (
    <div className="mx-auto max-w-7xl px-gutter py-8">
      <h1 className="text-2xl font-semibold">Parts</h1>
      <div className="mt-6 grid gap-8 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <UploadPanel />
        <PartsTable />
      </div>
    </div>
  );
}
