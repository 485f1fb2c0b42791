import { describe, expect, it } from "vitest";
import { reconcileNoteKeys } from "./reconcile-keys";

// Hand-made key lists. Where they come from a real file, the comment says which and why the two
// sides differ; the rest are built to the key format of lib/musicxml/note-key.ts.

describe("reconcileNoteKeys", () => {
  it("leaves a page that agrees with the server as it is", () => {
    const keys = ["P1:m0:s1:v1:0/1:60", "", "P1:m0:s1:v1:1/2:62", "P1:m0:s1:v1:1/2:62", "P1:m1:s1:v1:0/1:64:g1", "P1:m1:s1:v1:0/1:65"];
    const server = ["P1:m0:s1:v1:0/1:60", "P1:m0:s1:v1:1/2:62", "P1:m1:s1:v1:0/1:64:g1", "P1:m1:s1:v1:0/1:65"];
    const result = reconcileNoteKeys(keys, server);
    expect(result.keys).toEqual(keys);
    expect(result.mapped.size).toBe(0);
    expect(result.unmapped).toEqual([]);
  });

  it("maps the two A3s the engraver moves in bar 4 of incorrect_time_signature_pv.mxl onto their written times", () => {
    // tests/fixtures/real/music21/demos/incorrect_time_signature_pv.mxl, bar 4 (index 3), lower
    // staff, voice 5: an invisible dotted whole rest in 4/4, then two A3s written at 3/2 and 9/4
    // (MusicXML `duration`: 24 and 36 divisions at 4 per quarter). The engraver cuts the rest to
    // the bar's length and places them at 1/1 and 7/4 (see tests/e2e/note-keys.e2e.ts).
    const page = ["P2:m3:s2:v6:0/1:57", "", "P2:m3:s2:v5:1/1:57", "P2:m3:s2:v6:3/2:50", "P2:m3:s2:v5:7/4:57", "P2:m3:s2:v6:9/4:50"];
    const server = ["P2:m3:s2:v5:3/2:57", "P2:m3:s2:v5:9/4:57", "P2:m3:s2:v6:0/1:57", "P2:m3:s2:v6:3/2:50", "P2:m3:s2:v6:9/4:50"];
    const result = reconcileNoteKeys(page, server);
    expect(result.keys).toEqual(["P2:m3:s2:v6:0/1:57", "", "P2:m3:s2:v5:3/2:57", "P2:m3:s2:v6:3/2:50", "P2:m3:s2:v5:9/4:57", "P2:m3:s2:v6:9/4:50"]);
    expect(result.mapped).toEqual(
      new Map([
        ["P2:m3:s2:v5:1/1:57", "P2:m3:s2:v5:3/2:57"],
        ["P2:m3:s2:v5:7/4:57", "P2:m3:s2:v5:9/4:57"],
      ]),
    );
    expect(result.unmapped).toEqual([]);
  });

  it("pairs in time order, whatever order the lists come in", () => {
    const page = ["P1:m2:s1:v1:3/4:67", "P1:m2:s1:v1:1/4:67", "P1:m2:s1:v1:11/8:67"];
    const server = ["P1:m2:s1:v1:3/2:67", "P1:m2:s1:v1:1/2:67", "P1:m2:s1:v1:1/1:67"];
    expect(reconcileNoteKeys(page, server).keys).toEqual(["P1:m2:s1:v1:1/1:67", "P1:m2:s1:v1:1/2:67", "P1:m2:s1:v1:3/2:67"]);
  });

  it("keeps a tie chain one note: the continuations' repeated key is mapped with the first", () => {
    // A tied note carries the key of its first note on every continuation (osmd-note-keys.ts).
    const page = ["P1:m1:s1:v1:1/1:72", "", "P1:m1:s1:v1:1/1:72", "P1:m1:s1:v1:1/1:72"];
    const server = ["P1:m1:s1:v1:5/4:72"];
    const result = reconcileNoteKeys(page, server);
    expect(result.keys).toEqual(["P1:m1:s1:v1:5/4:72", "", "P1:m1:s1:v1:5/4:72", "P1:m1:s1:v1:5/4:72"]);
    expect(result.mapped.size).toBe(1);
  });

  it("maps a moved chord tone by tone, each onto the server's tone of its own pitch", () => {
    // A chord of C4 E4 G4 moved from 1/2 to 1/4 with a C4 of another voice left where it was.
    const page = ["P1:m0:s1:v1:1/4:60", "P1:m0:s1:v1:1/4:64", "P1:m0:s1:v1:1/4:67", "P1:m0:s1:v2:1/2:60"];
    const server = ["P1:m0:s1:v1:1/2:60", "P1:m0:s1:v1:1/2:64", "P1:m0:s1:v1:1/2:67", "P1:m0:s1:v2:1/2:60"];
    expect(reconcileNoteKeys(page, server).keys).toEqual(server);
  });

  it("maps grace notes only onto grace notes of the same number", () => {
    const page = ["P1:m4:s1:v1:1/4:74:g1", "P1:m4:s1:v1:1/4:74:g2", "P1:m4:s1:v1:1/4:76"];
    const server = ["P1:m4:s1:v1:1/2:74:g1", "P1:m4:s1:v1:1/2:74:g2", "P1:m4:s1:v1:1/2:76"];
    const result = reconcileNoteKeys(page, server);
    expect(result.keys).toEqual(server);
    expect(result.mapped.get("P1:m4:s1:v1:1/4:74:g2")).toBe("P1:m4:s1:v1:1/2:74:g2");
  });

  it("never maps across groups: another pitch, voice, staff, bar, part or grace number is another note", () => {
    const page = ["P1:m0:s1:v1:1/4:60"];
    for (const other of [
      "P1:m0:s1:v1:1/2:61", // pitch
      "P1:m0:s1:v2:1/2:60", // voice
      "P1:m0:s2:v1:1/2:60", // staff
      "P1:m1:s1:v1:1/2:60", // bar
      "P2:m0:s1:v1:1/2:60", // part
      "P1:m0:s1:v1:1/2:60:g1", // grace
    ]) {
      const result = reconcileNoteKeys(page, [other]);
      expect(result.keys, other).toEqual(page);
      expect(result.unmapped, other).toEqual(page);
    }
  });

  it("leaves a group unmapped when its counts differ, and maps the groups beside it", () => {
    // Two page notes unknown to the server, one server note the page lacks: which is which
    // cannot be told, so neither is guessed.
    const page = ["P1:m0:s1:v1:1/4:60", "P1:m0:s1:v1:3/4:60", "P1:m0:s1:v1:1/4:62"];
    const server = ["P1:m0:s1:v1:1/2:60", "P1:m0:s1:v1:1/2:62"];
    const result = reconcileNoteKeys(page, server);
    expect(result.keys).toEqual(["P1:m0:s1:v1:1/4:60", "P1:m0:s1:v1:3/4:60", "P1:m0:s1:v1:1/2:62"]);
    expect(result.unmapped).toEqual(["P1:m0:s1:v1:1/4:60", "P1:m0:s1:v1:3/4:60"]);
    // The other way round: one page note, two server notes it could be.
    const reverse = reconcileNoteKeys(["P1:m0:s1:v1:1/4:60"], ["P1:m0:s1:v1:1/2:60", "P1:m0:s1:v1:3/4:60"]);
    expect(reverse.unmapped).toEqual(["P1:m0:s1:v1:1/4:60"]);
    expect(reverse.mapped.size).toBe(0);
  });

  it("pairs only with server notes the page did not produce", () => {
    // The server's 1/2 is on the page already; the unknown 1/4 has nothing left to stand for.
    const result = reconcileNoteKeys(["P1:m0:s1:v1:1/4:60", "P1:m0:s1:v1:1/2:60"], ["P1:m0:s1:v1:1/2:60"]);
    expect(result.unmapped).toEqual(["P1:m0:s1:v1:1/4:60"]);
  });

  it("reports a page key that is not a note key instead of hiding it", () => {
    const result = reconcileNoteKeys(["not a key", "P1:m0:s1:v1:0/1:60"], ["P1:m0:s1:v1:0/1:60"]);
    expect(result.unmapped).toEqual(["not a key"]);
    expect(result.keys).toEqual(["not a key", "P1:m0:s1:v1:0/1:60"]);
  });

  it("with a list covering the opening only, leaves later bars alone and unreported", () => {
    const page = ["P1:m0:s1:v1:1/4:60", "P1:m16:s1:v1:0/1:62", "P1:m20:s1:v1:0/1:64"];
    const opening = ["P1:m0:s1:v1:1/2:60"];
    const result = reconcileNoteKeys(page, opening, { measures: 16 });
    expect(result.keys).toEqual(["P1:m0:s1:v1:1/2:60", "P1:m16:s1:v1:0/1:62", "P1:m20:s1:v1:0/1:64"]);
    expect(result.unmapped).toEqual([]);
    // Taken as the whole part, the same list leaves the later notes unknown.
    expect(reconcileNoteKeys(page, opening).unmapped).toEqual(["P1:m16:s1:v1:0/1:62", "P1:m20:s1:v1:0/1:64"]);
  });
});
