import { describe, expect, it } from "vitest";
import type { GraphicalNote } from "opensheetmusicdisplay";
import { keyNotesAsServer, type OsmdNoteRef } from "./osmd-note-keys";

// Drawn notes as collectOsmdNotes gives them (the engraver's objects are not read here). The keys
// are those of bar 4 of tests/fixtures/real/music21/demos/incorrect_time_signature_pv.mxl, lower
// staff: voice 5's A3s written at 3/2 and 9/4, engraved at 1/1 and 7/4 (see note-keys.e2e.ts).
const ref = (key: string, over: Partial<OsmdNoteRef> = {}): OsmdNoteRef => ({
  key,
  measureIndex: 3,
  graphicalNote: {} as GraphicalNote,
  svgGroup: null,
  isRest: key === "",
  isTieContinuation: false,
  isGrace: false,
  ...over,
});

const SERVER = ["P2:m3:s2:v5:3/2:57", "P2:m3:s2:v5:9/4:57", "P2:m3:s2:v6:0/1:57"];

describe("keyNotesAsServer", () => {
  it("gives the moved notes, and their tie continuations, the server's keys", () => {
    const refs = [ref("P2:m3:s2:v6:0/1:57"), ref(""), ref("P2:m3:s2:v5:1/1:57"), ref("P2:m3:s2:v5:7/4:57"), ref("P2:m3:s2:v5:7/4:57", { isTieContinuation: true })];
    const { refs: keyed, unmapped } = keyNotesAsServer(refs, { keys: SERVER });
    expect(keyed.map((r) => r.key)).toEqual(["P2:m3:s2:v6:0/1:57", "", "P2:m3:s2:v5:3/2:57", "P2:m3:s2:v5:9/4:57", "P2:m3:s2:v5:9/4:57"]);
    expect(unmapped).toEqual([]);
    // Everything else about a note is kept; a note already right is the same object.
    expect(keyed[4].isTieContinuation).toBe(true);
    expect(keyed[0]).toBe(refs[0]);
  });

  it("takes a note it cannot pair out of selection (no key) and returns it, once per tie chain", () => {
    const refs = [ref("P2:m3:s2:v5:1/1:57"), ref("P2:m3:s2:v5:1/1:57", { isTieContinuation: true })];
    // Two server notes the page lacks for one page note: which one it is cannot be told.
    const { refs: keyed, unmapped } = keyNotesAsServer(refs, { keys: SERVER });
    expect(keyed.map((r) => r.key)).toEqual(["", ""]);
    expect(unmapped).toEqual([refs[0]]);
  });

  it("keeps the engraver's keys without a server list, and of bars after an opening's list", () => {
    const refs = [ref("P2:m3:s2:v5:1/1:57")];
    expect(keyNotesAsServer(refs, null).refs.map((r) => r.key)).toEqual(["P2:m3:s2:v5:1/1:57"]);
    const opening = keyNotesAsServer(refs, { keys: [], measures: 2 });
    expect(opening.refs.map((r) => r.key)).toEqual(["P2:m3:s2:v5:1/1:57"]);
    expect(opening.unmapped).toEqual([]);
  });
});
