import fs from "node:fs/promises";
import path from "node:path";
import { notFound } from "next/navigation";
import { DevRealScore } from "@/components/score/dev-real-score";
import { config } from "@/lib/config";
import { readScoreFile, selectPartsXml } from "@/lib/musicxml";

/**
 * Development and test page: one part of a file of the real corpus (`tests/fixtures/real/`),
 * read by the server and engraved by the workspace's score view. Absent in production.
 */
export const dynamic = "force-dynamic";

// Folders and file names of the corpus only: letters, digits, dots, dashes and underscores.
const FILE = /^(?:[A-Za-z0-9_-][A-Za-z0-9._-]*\/)*[A-Za-z0-9_-][A-Za-z0-9._-]*\.(?:mxl|xml|musicxml)$/;
const PART = /^[A-Za-z0-9_.-]{1,64}$/;

export default async function DevRealScorePage({ searchParams }: { searchParams: Promise<{ file?: string | string[]; part?: string | string[]; mend?: string | string[] }> }) {
  if (config().APP_ENV === "production") notFound();
  // `mend=0` skips the known mends, to check that the bars they would mend are found by trying.
  const { file, part, mend } = await searchParams;
  if (typeof file !== "string" || !FILE.test(file) || file.split("/").includes("..")) notFound();
  const root = path.join(process.cwd(), "tests", "fixtures", "real");
  let bytes: Buffer;
  try {
    bytes = await fs.readFile(path.join(root, file));
  } catch {
    notFound();
  }
  const { score, partwiseXml } = readScoreFile(new Uint8Array(bytes), file);
  const partId = typeof part === "string" && PART.test(part) ? part : score.parts[0]?.id;
  if (!partId || !score.parts.some((p) => p.id === partId)) notFound();
  return (
    <div className="px-gutter py-6">
      <h1 className="mb-4 text-lg font-semibold">
        {file} · {partId}
      </h1>
      <DevRealScore xml={selectPartsXml(partwiseXml, [partId])} mend={mend !== "0"} />
    </div>
  );
}
