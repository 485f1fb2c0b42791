import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { binaryFixtures, zipBomb } from "../../scripts/hostile-zip";
import { MusicXmlError, readScoreFile } from "./index";

const DIR = path.join(import.meta.dirname, "../../tests/fixtures/hostile");

/** Every hostile or broken file, with the one answer it must get. null = must load. */
const EXPECTED: Record<string, string | null> = {
  "truncated.musicxml": "bad_request:truncated",
  "not-xml.musicxml": "unsupported:not_xml",
  "binary-noise.musicxml": "unsupported:not_xml",
  "wrong-root.musicxml": "unsupported:not_musicxml",
  "opus.musicxml": "unsupported:not_musicxml",
  "image-renamed.musicxml": "unsupported:image",
  "pdf-renamed.musicxml": "unsupported:pdf",
  "empty.musicxml": "bad_request:empty",
  "malformed.musicxml": "bad_request:malformed",
  "billion-laughs.musicxml": "bad_request:entity_refused",
  "external-entity.musicxml": "bad_request:entity_refused",
  "parameter-entity.musicxml": "bad_request:entity_refused",
  "entity-without-doctype.musicxml": "bad_request:entity_refused",
  "absurd-nesting.musicxml": "bad_request:nesting",
  "zero-divisions.musicxml": "bad_request:divisions",
  "negative-divisions.musicxml": "bad_request:divisions",
  "negative-duration.musicxml": "bad_request:duration",
  // A bar of 40 beats in 4/4 is what a cadenza or an unmeasured bar looks like in real files: it
  // loads, read as written, with a notice (see the test below); it is no longer refused.
  "measure-overflow.musicxml": null,
  "no-score.mxl": "bad_request:mxl_no_score",
  "too-many-entries.mxl": "too_large:mxl_entries",
  "truncated-archive.mxl": "bad_request:mxl_corrupt",
  "unknown-elements.musicxml": null,
  "external-dtd.musicxml": null,
};

function attempt(bytes: Uint8Array, name: string): { error: MusicXmlError | null; ms: number } {
  const t0 = performance.now();
  try {
    readScoreFile(bytes, name);
    return { error: null, ms: performance.now() - t0 };
  } catch (err) {
    if (!(err instanceof MusicXmlError)) throw err;
    return { error: err, ms: performance.now() - t0 };
  }
}

describe("hostile and broken files", () => {
  const files = readdirSync(DIR).filter((f) => !f.startsWith("."));

  it("the corpus holds at least 15 files and every one has an expected answer", () => {
    expect(files.length).toBeGreaterThanOrEqual(15);
    expect(files.sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  it("the script's binary fixtures get the same answers as the committed copies", () => {
    // ZIP timestamps differ between runs, so compare answers, not bytes.
    for (const [name, bytes] of Object.entries(binaryFixtures())) {
      expect(attempt(bytes, name).error?.code, name).toBe(EXPECTED[name]);
    }
  });

  for (const [file, code] of Object.entries(EXPECTED)) {
    it(`${file} → ${code ?? "loads"}`, () => {
      const { error, ms } = attempt(new Uint8Array(readFileSync(path.join(DIR, file))), file);
      expect(ms).toBeLessThan(2000);
      if (code === null) {
        expect(error).toBeNull();
        return;
      }
      expect(error?.code).toBe(code);
      expect(error!.status).toBeGreaterThanOrEqual(400);
      expect(error!.status).toBeLessThan(500);
      // A message a player can act on: says what is wrong and what to do, with no stack or XML noise.
      expect(error!.message.length).toBeGreaterThan(40);
      expect(error!.message).not.toMatch(/\bat .*\.ts:|undefined|\[object/);
    });
  }

  it("gives each code its own message, naming what was wrong", () => {
    const byCode = new Map<string, Set<string>>();
    const technicalByCode = new Map<string, Set<string>>();
    for (const [file, code] of Object.entries(EXPECTED)) {
      if (!code) continue;
      const { error } = attempt(new Uint8Array(readFileSync(path.join(DIR, file))), file);
      byCode.set(code, (byCode.get(code) ?? new Set()).add(error!.message));
      const technical = (error!.extra.details as { technical?: string } | undefined)?.technical;
      if (technical) technicalByCode.set(code, (technicalByCode.get(code) ?? new Set()).add(technical));
    }
    const all = [...byCode.values()].flatMap((s) => [...s]);
    expect(new Set(all).size).toBe(all.length); // no message shared across codes
    // The technical detail behind "Details" quotes the value each refused.
    expect(technicalByCode.get("bad_request:divisions")!.size).toBe(2);
  });

  it("speaks the player's words: no element names, DTD or measure in a message; the detail keeps them", () => {
    for (const [file, code] of Object.entries(EXPECTED)) {
      if (!code) continue;
      const { error } = attempt(new Uint8Array(readFileSync(path.join(DIR, file))), file);
      expect(error!.message, file).not.toMatch(/<[a-z!][^>]*>|\bDTD\b|\b[Mm]easure\b|\bentit(y|ies)\b/);
    }
    const { error } = attempt(new Uint8Array(readFileSync(path.join(DIR, Object.keys(EXPECTED).find((f) => EXPECTED[f] === "bad_request:divisions")!))), "x");
    expect(error!.message).toMatch(/\bbar \S+/);
    expect((error!.extra.details as { technical: string }).technical).toContain("<divisions>");
  });

  it("reads the overlong bar as written and names it in player's words", () => {
    const { score } = readScoreFile(new Uint8Array(readFileSync(path.join(DIR, "measure-overflow.musicxml"))), "measure-overflow.musicxml");
    // duration 40 at divisions 1 = 40 quarter notes, in 4/4 = 40 beats (MusicXML 4.0, divisions)
    expect(score.notices.map((n) => n.message)).toEqual(["bar 2 lasts 40 beats in 4/4 — read as written"]);
    expect(score.parts[0].notes.at(-1)!.duration).toEqual({ num: 10, den: 1 });
  });

  it("loads unknown elements as if they were absent", () => {
    const { score } = readScoreFile(new Uint8Array(readFileSync(path.join(DIR, "unknown-elements.musicxml"))), "x");
    const notes = score.parts[0].notes;
    expect(notes.map((n) => n.pitch?.name ?? "rest")).toEqual(["C5", "D5", "rest"]);
  });

  it("never reads the file an external DTD names, and drops the DOCTYPE from the output", () => {
    const { partwiseXml, score } = readScoreFile(new Uint8Array(readFileSync(path.join(DIR, "external-dtd.musicxml"))), "x");
    expect(score.parts[0].notes).toHaveLength(4);
    expect(partwiseXml).not.toMatch(/DOCTYPE|passwd|root:/);
  });

  it("refuses a file over the size limit before reading it", () => {
    const bytes = new Uint8Array(readFileSync(path.join(DIR, "unknown-elements.musicxml")));
    expect(() => readScoreFile(bytes, "x", { maxFileBytes: 100 })).toThrow(expect.objectContaining({ code: "too_large:file" }));
  });
});

describe("ZIP bombs", () => {
  const arrayBuffers = () => process.memoryUsage().arrayBuffers;

  it("refuses a 1 GiB bomb from its directory, before inflating anything", () => {
    const bomb = zipBomb({ lie: false });
    expect(bomb.length).toBeLessThan(1.1 * 1024 * 1024); // ≈1 MB holding ≈1 GiB of zeros
    const before = arrayBuffers();
    const { error, ms } = attempt(bomb, "bomb.mxl");
    expect(error?.code).toBe("too_large:mxl_uncompressed");
    expect(ms).toBeLessThan(500);
    expect(arrayBuffers() - before).toBeLessThan(8 * 1024 * 1024);
  });

  it("stops a bomb whose headers lie about its size once the inflated bytes pass the limit", () => {
    const bomb = zipBomb({ lie: true });
    let peakBuffers = 0;
    let peakRss = 0;
    const base = { buffers: arrayBuffers(), rss: process.memoryUsage().rss };
    const timer = setInterval(() => {
      peakBuffers = Math.max(peakBuffers, arrayBuffers() - base.buffers);
      peakRss = Math.max(peakRss, process.memoryUsage().rss - base.rss);
    }, 1);
    const { error, ms } = attempt(bomb, "bomb.mxl");
    clearInterval(timer);
    // The read is synchronous, so also sample right after it, before anything is collected.
    peakBuffers = Math.max(peakBuffers, arrayBuffers() - base.buffers);
    peakRss = Math.max(peakRss, process.memoryUsage().rss - base.rss);
    expect(error?.code).toBe("too_large:mxl_uncompressed");
    expect(ms).toBeLessThan(5000);
    // Bound: the 50 MB limit plus one slice's worth of output, never the gigabyte.
    expect(peakBuffers).toBeLessThan(120 * 1024 * 1024);
    expect(peakRss).toBeLessThan(300 * 1024 * 1024);
    console.log(`lying ZIP bomb: refused in ${ms.toFixed(0)} ms; arrayBuffers +${(peakBuffers / 2 ** 20).toFixed(1)} MB, rss +${(peakRss / 2 ** 20).toFixed(1)} MB`);
  });

  it("the same limit applies when the caller lowers it", () => {
    const bomb = zipBomb({ lie: true, copies: 100_000 }); // ≈25 MB of zeros
    expect(() => readScoreFile(bomb, "bomb.mxl", { maxUncompressedBytes: 1024 * 1024 })).toThrow(
      expect.objectContaining({ code: "too_large:mxl_uncompressed" }),
    );
  });
});
