import { notFound } from "next/navigation";
import { DevModelKeys } from "@/components/score/dev-model-keys";
import { config } from "@/lib/config";

/**
 * Development and test page: loads any normalized partwise text handed to it by an end-to-end test
 * into the engraving library's model (without drawing) and answers the browser's note keys, so a
 * whole corpus can be compared with the server's keys in one page. Absent in production.
 */
export const dynamic = "force-dynamic";

export default function DevNoteKeysPage() {
  if (config().APP_ENV === "production") notFound();
  return (
    <div className="px-gutter py-6">
      <h1 className="mb-4 text-lg font-semibold">Note keys from the engraver&apos;s model</h1>
      <DevModelKeys />
    </div>
  );
}
