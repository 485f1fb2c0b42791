/**
 * Writes the small binary hostile fixtures into tests/fixtures/hostile/ (the text ones are
 * committed as they are; the ZIP bombs are built inside the tests).
 * Usage: npx tsx scripts/make-hostile-fixtures.ts
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import { binaryFixtures } from "./hostile-zip";

const dir = path.join(process.cwd(), "tests/fixtures/hostile");
for (const [name, bytes] of Object.entries(binaryFixtures())) {
  writeFileSync(path.join(dir, name), bytes);
  console.log(`${name} ${bytes.length} bytes`);
}
