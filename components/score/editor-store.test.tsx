import { act, cleanup, render } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { EditorStoreProvider, createEditorStore, useSelection, ZOOM } from "./editor-store";
import { K, fakeBoxes } from "./test-fixtures";

afterEach(cleanup);

describe("editor store", () => {
  it("moves the selection through the laid-out notes in time order", () => {
    const store = createEditorStore({ partId: "p" });
    const { actions } = store.getState();
    actions.setLayout(fakeBoxes);
    actions.move("next", false);
    expect(store.getState().selection.keys).toEqual([K[0]]);
    actions.move("next", true);
    actions.move("next", true);
    expect(store.getState().selection).toEqual({ keys: [K[0], K[1], K[2]], anchor: K[0], focus: K[2] });
    actions.move("next-bar", false);
    expect(store.getState().selection.focus).toBe(K[3]);
    actions.clearSelection();
    expect(store.getState().selection.keys).toEqual([]);
  });

  it("ignores clicks on keys that are not selectable notes", () => {
    const store = createEditorStore({ partId: "p" });
    store.getState().actions.setLayout(fakeBoxes);
    store.getState().actions.select("P1:m9:s1:v1:0/1:60");
    expect(store.getState().selection.keys).toEqual([]);
  });

  it("keeps the selection across a re-layout (zoom, resize) when the notes remain", () => {
    const store = createEditorStore({ partId: "p" });
    const { actions } = store.getState();
    actions.setLayout(fakeBoxes);
    actions.select(K[1]);
    actions.select(K[3], "toggle");
    actions.setLayout(fakeBoxes.map((b) => ({ ...b, x: b.x * 1.5 })));
    expect(store.getState().selection.keys).toEqual([K[1], K[3]]);
    expect(store.getState().layoutVersion).toBe(2);
    actions.setLayout(fakeBoxes.slice(0, 2));
    expect(store.getState().selection.keys).toEqual([K[1]]);
  });

  it("clamps the zoom", () => {
    const store = createEditorStore({ partId: "p" });
    store.getState().actions.zoomBy(10);
    expect(store.getState().zoom).toBe(ZOOM.max);
    store.getState().actions.setZoom(0.01);
    expect(store.getState().zoom).toBe(ZOOM.min);
  });

  it("serves each part its own store through the provider", () => {
    const a = createEditorStore({ partId: "a" });
    a.getState().actions.setLayout(fakeBoxes);
    let seen: string[] = [];
    function Probe() {
      seen = useSelection().keys;
      return null;
    }
    render(
      <EditorStoreProvider partId="a" store={a}>
        <Probe />
      </EditorStoreProvider>,
    );
    act(() => a.getState().actions.select(K[2]));
    expect(seen).toEqual([K[2]]);
  });
});
