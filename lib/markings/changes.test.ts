import { describe, expect, it } from "vitest";
import {
  acceptSuggestions, applyChanges, applyDiff, applyServerChanges, clearSelection, diffToRequests, invertDiff,
  isEmptyDiff, patchSelection, setSelection, toState,
} from "./changes";
import { DEFAULT_MARKING, type MarkingDto } from "./schema";

const dto = (noteKey: string, over: Partial<MarkingDto> = {}): MarkingDto => ({
  ...DEFAULT_MARKING,
  noteKey,
  version: 3,
  authorId: "u1",
  updatedAt: "2026-01-01T00:00:00.000Z",
  ...over,
});
const now = { now: "2026-02-02T00:00:00.000Z" };
const A = "P1:m0:s1:v1:0/1:72";
const B = "P1:m0:s1:v1:1/4:74";
const C = "P1:m1:s1:v1:0/1:76";

describe("applyChanges", () => {
  it("reports a new marking as added, with version 0 until the server numbers it", () => {
    const { next, diff } = applyChanges({}, setSelection([A], DEFAULT_MARKING), now);
    expect(diff.added.map((m) => m.noteKey)).toEqual([A]);
    expect(next[A].version).toBe(0);
    expect(diff.updated).toEqual([]);
    expect(diff.removed).toEqual([]);
  });

  it("reports an edit as [from, to] and keeps the version it was edited from", () => {
    const state = toState([dto(A, { depthCents: 10 })]);
    const { next, diff } = applyChanges(state, patchSelection(state, [A], { depthCents: 40 }), now);
    expect(diff.updated).toHaveLength(1);
    expect(diff.updated[0][0].depthCents).toBe(10);
    expect(diff.updated[0][1].depthCents).toBe(40);
    expect(next[A].version).toBe(3);
    expect(next[A].speedHz).toBe(DEFAULT_MARKING.speedHz);
  });

  it("treats setting the values a note already has as no change", () => {
    const state = toState([dto(A)]);
    const { next, diff } = applyChanges(state, setSelection([A], DEFAULT_MARKING), now);
    expect(isEmptyDiff(diff)).toBe(true);
    expect(next[A]).toBe(state[A]);
  });

  it("collapses several changes to one note inside one commit", () => {
    const created = applyChanges({}, [...setSelection([A], DEFAULT_MARKING), { type: "remove", noteKey: A }], now);
    expect(isEmptyDiff(created.diff)).toBe(true);
    const state = toState([dto(A)]);
    const edited = applyChanges(
      state,
      [...patchSelection(state, [A], { depthCents: 50 }), { type: "set", noteKey: A, values: { ...DEFAULT_MARKING, depthCents: 60 } }],
      now,
    );
    expect(edited.diff.updated).toHaveLength(1);
    expect(edited.diff.updated[0][1].depthCents).toBe(60);
  });

  it("patches only the given field on a mixed selection and starts unmarked notes from the default", () => {
    const state = toState([dto(A, { depthCents: 10, role: "peak" }), dto(B, { speedHz: 7 })]);
    const { next, diff } = applyChanges(state, patchSelection(state, [A, B, C], { shape: "fading" }), now);
    expect(next[A]).toMatchObject({ depthCents: 10, role: "peak", shape: "fading" });
    expect(next[B]).toMatchObject({ speedHz: 7, shape: "fading" });
    expect(next[C]).toMatchObject({ ...DEFAULT_MARKING, shape: "fading" });
    expect(diff.updated).toHaveLength(2);
    expect(diff.added).toHaveLength(1);
  });

  it("clears only notes that are marked", () => {
    const state = toState([dto(A)]);
    const changes = clearSelection(state, [A, B]);
    expect(changes).toEqual([{ type: "remove", noteKey: A }]);
    const { next, diff } = applyChanges(state, changes, now);
    expect(next[A]).toBeUndefined();
    expect(diff.removed.map((m) => m.noteKey)).toEqual([A]);
  });

  it("accepting a suggestion sets the role and keeps the rest of the marking", () => {
    const state = toState([dto(A, { depthCents: 33, comment: "breathe" })]);
    const { next } = applyChanges(state, acceptSuggestions(state, [{ noteKey: A, role: "tension" }, { noteKey: B, role: "resolution" }]), now);
    expect(next[A]).toMatchObject({ depthCents: 33, comment: "breathe", role: "tension" });
    expect(next[B]).toMatchObject({ ...DEFAULT_MARKING, role: "resolution" });
  });

  it("does not change the state it was given", () => {
    const state = toState([dto(A)]);
    const frozen = JSON.stringify(state);
    applyChanges(state, [{ type: "remove", noteKey: A }, ...setSelection([B], DEFAULT_MARKING)], now);
    expect(JSON.stringify(state)).toBe(frozen);
  });
});

describe("diffs", () => {
  it("inverting a commit and applying it restores the state before", () => {
    const state = toState([dto(A, { depthCents: 10 }), dto(B)]);
    const changes = [...patchSelection(state, [A, C], { depthCents: 70 }), ...clearSelection(state, [B])];
    const { next, diff } = applyChanges(state, changes, now);
    expect(applyDiff(next, invertDiff(diff))).toEqual(state);
  });

  it("turns a commit into one request per note: PUT for added and updated, DELETE for removed", () => {
    const state = toState([dto(A), dto(B)]);
    const { diff } = applyChanges(state, [...patchSelection(state, [A, C], { role: "peak" }), ...clearSelection(state, [B])], now);
    const requests = diffToRequests(diff);
    expect(requests.map((r) => `${r.method} ${r.noteKey}`).sort()).toEqual([`DELETE ${B}`, `PUT ${A}`, `PUT ${C}`].sort());
    const put = requests.find((r) => r.method === "PUT" && r.noteKey === A);
    expect(put && "body" in put ? put.body.role : undefined).toBe("peak");
    expect(put && "body" in put ? Object.keys(put.body).sort() : []).toEqual(
      ["comment", "depthCents", "onset", "placement", "role", "shape", "speedHz"],
    );
  });

  it("applies the server's undo result: a marking per note, or null when it is gone", () => {
    const state = toState([dto(A), dto(B)]);
    const next = applyServerChanges(state, [
      { noteKey: A, marking: null },
      { noteKey: C, marking: dto(C, { version: 1 }) },
    ]);
    expect(Object.keys(next).sort()).toEqual([B, C].sort());
  });
});
