/**
 * Guards speed work on the reader: the model it builds must not change. Reads every score under
 * tests/fixtures/ and samples/ plus generated parts (scripts/bench/reader.ts), twice (plainly, and
 * with note sites and own elements dropped, as the export and the upload's marking import ask),
 * and writes one canonical JSON file per read: score, normalized text, sites, or the refusal.
 *
 *   npx tsx scripts/reader-snapshot.ts write test-results/reader-before
 *   npx tsx scripts/reader-snapshot.ts compare test-results/reader-before
 *
 * `compare` prints the first differing read and exits 1 when any read differs.
 */
import { OWN_SITES } from "../lib/export/note-sites";
import { readScoreFile } from "../lib/musicxml";
import { generatePart } from "./bench/reader";
import { canonical, refusal, runSnapshot, snapshotInputs } from "./snapshot";

function* readAll(): Generator<{ name: string; json: string }> {
  for (const { name, load } of snapshotInputs(generatePart)) {
    const bytes = load();
    for (const mode of ["plain", "sites"] as const) {
      let result: unknown;
      try {
        result = readScoreFile(bytes, name, { maxFileBytes: Infinity }, mode === "sites" ? { sites: OWN_SITES, dropOwn: true } : undefined);
      } catch (err) {
        result = refusal(err);
      }
      yield { name: `${name} (${mode})`, json: canonical(result) };
    }
  }
}

runSnapshot("reader-snapshot.ts", { one: "read", many: "reads" }, readAll());
