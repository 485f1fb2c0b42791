import fs from "node:fs/promises";
import path from "node:path";
import Link from "next/link";
import { notFound } from "next/navigation";
import { DevEngraving } from "@/components/score/dev-engraving";
import { config } from "@/lib/config";
import { readScoreFile } from "@/lib/musicxml";

/**
 * Development and test page: engraves one file of `samples/` exactly as the workspace will (the
 * server reads it, the browser only receives the normalized partwise text) and exposes the
 * browser's note keys for the end-to-end comparison with the server's. Absent in production.
 */
export const dynamic = "force-dynamic";

const SAMPLE_NAME = /^[a-z0-9][a-z0-9-]*\.(musicxml|mxl)$/;
const samplesDir = () => path.join(process.cwd(), "samples");

export default async function DevEngravePage({ searchParams }: { searchParams: Promise<{ sample?: string | string[] }> }) {
  if (config().APP_ENV === "production") notFound();
  const { sample } = await searchParams;

  if (sample === undefined) {
    const files = (await fs.readdir(samplesDir())).filter((f) => SAMPLE_NAME.test(f)).sort();
    return (
      <div className="mx-auto max-w-3xl px-gutter py-10">
        <h1 className="text-2xl font-semibold">Samples</h1>
        <ul className="mt-4 space-y-1">
          {files.map((f) => (
            <li key={f}>
              <Link className="text-accent underline" href={`/dev/engrave?sample=${encodeURIComponent(f)}`}>{f}</Link>
            </li>
          ))}
        </ul>
      </div>
    );
  }

  // Only plain names of files in samples/: nothing here can reach another folder.
  if (typeof sample !== "string" || !SAMPLE_NAME.test(sample)) notFound();
  let bytes: Buffer;
  try {
    bytes = await fs.readFile(path.join(samplesDir(), sample));
  } catch {
    notFound();
  }
  const { partwiseXml } = readScoreFile(new Uint8Array(bytes), sample);
  return (
    <div className="px-gutter py-6">
      <h1 className="mb-4 text-lg font-semibold">{sample}</h1>
      <DevEngraving xml={partwiseXml} />
    </div>
  );
}
