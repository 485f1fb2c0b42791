import { QueryClient, QueryClientProvider, onlineManager } from "@tanstack/react-query";
import { act, cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { useEffect, type ReactNode } from "react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { PartAnalysis } from "@/lib/analysis/types";
import type { MarkingDto } from "@/lib/markings/schema";
import type { ScoreViewProps } from "@/components/score/score-view";
import { K, fakeBoxes } from "@/components/score/test-fixtures";

// The engraving library cannot run in jsdom: the score view reports a fixed layout instead, at
// once or, while `engraving.hold` is set, when the test calls `engraving.finish()`.
const engraving = vi.hoisted(() => ({
  hold: false,
  finish: () => {},
  given: [] as Array<{ xml: string | undefined; opening: string | null | undefined }>,
  keys: [] as Array<ScoreViewProps["noteKeys"]>,
}));
vi.mock("@/components/score/score-view", () => ({
  ScoreView: ({ xml, opening, onLayout, onSettled, noteKeys, children }: ScoreViewProps) => {
    engraving.given.push({ xml, opening });
    engraving.keys.push(noteKeys);
    useEffect(() => {
      const publish = () => {
        onLayout({ boxes: fakeBoxes, width: 800, height: 400, systems: [] });
        onSettled?.();
      };
      if (engraving.hold) engraving.finish = publish;
      else publish();
    }, [onLayout, onSettled]);
    return <div data-testid="score">{children}</div>;
  },
}));

const { Workspace } = await import("./workspace");

/** An in-memory stand-in for the part's JSON routes, keeping versions and history like the server. */
class FakeServer {
  markings = new Map<string, MarkingDto>();
  history: { noteKey: string; before: MarkingDto | null; after: MarkingDto | null; group: string; undone: boolean }[] = [];
  requests: { method: string; url: string; body?: unknown; at: number }[] = [];
  /** Marking writes answer 503 with this Retry-After (seconds), or get no answer at all. */
  writesDown: { retryAfter: number } | "network" | null = null;
  /** Marking writes that land but whose answer is lost on the way back. */
  answersLost = 0;
  /** While set, the part's text is answered only when `sendText()` is called. */
  holdText = false;
  sendText = () => {};
  analysis: PartAnalysis = {
    id: "P1", name: "Flute", measureCount: 3, noteCount: 5,
    key: { tonic: "C", mode: "major", fifths: 0, source: "signature" }, localKeys: [],
    notes: fakeBoxes.map((b, i) => ({ key: b.key, measure: String(b.measureIndex + 1), pitch: ["C5", "D5", "E5", "B4", "C5"][i], midi: 60, onset: "0/1", duration: "1/4", degree: 1 })),
    phrases: [{ start: K[0], peak: K[2], end: K[4] }],
    suggestions: [{ note: K[3], measure: "3", pitch: "B4", role: "tension", confidence: 0.9, resolvesTo: K[4], reason: "B is the leading tone of C major; it rises to C." }],
  };

  /** The player's line; `lowerAnalysis` set = the staff carries two players. */
  line: "upper" | "lower" = "upper";
  lowerAnalysis: PartAnalysis | null = null;

  set(noteKey: string, values: Partial<MarkingDto>) {
    const before = this.markings.get(noteKey) ?? null;
    const after = { ...(before ?? {}), ...values, noteKey, version: (before?.version ?? 0) + 1, authorId: "u", updatedAt: new Date().toISOString() } as MarkingDto;
    this.markings.set(noteKey, after);
    return after;
  }

  fetch = async (input: string, init: RequestInit = {}): Promise<Response> => {
    const method = init.method ?? "GET";
    const url = new URL(input, "http://local");
    const body = init.body ? JSON.parse(String(init.body)) : undefined;
    this.requests.push({ method, url: url.pathname + url.search, body, at: Date.now() });
    const isWrite = (method === "PUT" || method === "DELETE") && /\/markings\//.test(url.pathname);
    const down = this.writesDown;
    if (isWrite && down) {
      if (down === "network") throw new TypeError("Failed to fetch");
      return new Response(JSON.stringify({ code: "unavailable:database", message: "Try again in a few seconds." }), {
        status: 503, headers: { "content-type": "application/json", "retry-after": String(down.retryAfter) },
      });
    }
    const path = url.pathname.replace("/api/parts/part-1", "");
    const json = (data: unknown, status = 200) => new Response(JSON.stringify(data), { status, headers: { "content-type": "application/json" } });
    if (path === "" && method === "PATCH" && body.line) this.line = body.line;
    if (path === "") return json({ id: "part-1", title: "Little Air", composer: "A. Maker", keyLabel: "C major", tempo: 60, chosenPartId: "P1", ...(this.lowerAnalysis ? { line: this.line } : {}), parts: [], measureCount: 3, noteCount: 5, version: 1, updatedAt: "", permission: "owner" });
    if (path === "/musicxml") {
      if (this.holdText) await new Promise<void>((resolve) => (this.sendText = resolve));
      return new Response("<score-partwise/>", { status: 200 });
    }
    if (path === "/note-keys") return json({ keys: fakeBoxes.map((b) => b.key) });
    if (path === "/analysis") {
      if (!this.lowerAnalysis) return json(this.analysis);
      const line = url.searchParams.get("line") ?? this.line;
      return json(line === "lower" ? this.lowerAnalysis : { ...this.analysis, lines: { writtenAs: "voices", line: "upper" } });
    }
    if (path === "/markings") return json({ markings: [...this.markings.values()] });
    if (path === "/history") return json({ canUndo: this.history.some((h) => !h.undone), canRedo: this.history.some((h) => h.undone), entries: [] });
    if (path === "/suggestions/decisions") return json({ decisions: [] });
    if (path === "/history/undo") {
      const last = [...this.history].reverse().find((h) => !h.undone);
      const group = this.history.filter((h) => h.group === last?.group);
      const changes = group.reverse().map((h) => {
        h.undone = true;
        if (h.before) this.markings.set(h.noteKey, this.set(h.noteKey, h.before));
        else this.markings.delete(h.noteKey);
        return { noteKey: h.noteKey, marking: this.markings.get(h.noteKey) ?? null };
      });
      return json({ changes, canUndo: this.history.some((h) => !h.undone), canRedo: true });
    }
    const m = /^\/markings\/(.+)$/.exec(path);
    if (m) {
      const noteKey = decodeURIComponent(m[1]);
      const current = this.markings.get(noteKey) ?? null;
      const version = method === "DELETE" ? Number(url.searchParams.get("version")) : body.version;
      if ((current?.version ?? undefined) !== (version || undefined)) return json({ code: "conflict:marking", message: "Changed elsewhere.", current }, 409);
      if (method === "DELETE") {
        this.markings.delete(noteKey);
        this.history.push({ noteKey, before: current, after: null, group: url.searchParams.get("group") ?? "g", undone: false });
        return json({ noteKey, deleted: true });
      }
      const { version: _v, group, ...values } = body;
      const after = this.set(noteKey, values);
      this.history.push({ noteKey, before: current, after, group: group ?? "g", undone: false });
      if (this.answersLost > 0) {
        this.answersLost -= 1;
        throw new TypeError("Failed to fetch");
      }
      return json({ marking: after });
    }
    return json({ code: "not_found:route", message: "none" }, 404);
  };
}

let server: FakeServer;

beforeEach(() => {
  engraving.hold = false;
  engraving.given = [];
  engraving.keys = [];
  // Each test's fetch reaches its own server: a write still retrying from an earlier test never lands in this one.
  const own = (server = new FakeServer());
  vi.stubGlobal("fetch", vi.fn((input: string, init?: RequestInit) => own.fetch(input, init)));
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

afterEach(() => onlineManager.setOnline(true));

function open({ opening, openingKeys }: { opening?: string; openingKeys?: string[] } = {}): { client: QueryClient } {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const wrap = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  render(<Workspace partId="part-1" opening={opening} openingKeys={openingKeys} />, { wrapper: wrap });
  return { client };
}

const hit = (key: string) => document.querySelector(`[data-layer="hits"] [data-note-key="${key}"]`)!;
const saveState = () => screen.getByTestId("save-state").getAttribute("data-state");
const saveText = () => screen.getByTestId("save-state").textContent ?? "";
const puts = () => server.requests.filter((r) => r.method === "PUT");
/** Whether leaving the page now would ask the player to confirm. */
function leavingWarns(): boolean {
  const event = new Event("beforeunload", { cancelable: true });
  window.dispatchEvent(event);
  return event.defaultPrevented;
}

async function setDepth(value: string) {
  const input = screen.getByLabelText(/^Depth$/, { selector: "input" });
  fireEvent.change(input, { target: { value } });
  fireEvent.blur(input);
}

describe("Workspace", () => {
  it("engraves a long part's opening from the page, asks for the whole text once it is drawn, then hands the whole over", async () => {
    engraving.hold = true;
    server.holdText = true;
    open({ opening: "<score-partwise><!-- the first bars --></score-partwise>", openingKeys: [K[0], K[1]] });
    await screen.findByTestId("score");
    expect(engraving.given[0]).toEqual({ xml: undefined, opening: "<score-partwise><!-- the first bars --></score-partwise>" });
    // The opening is keyed by the server's keys of its bars, said to cover only the opening.
    expect(engraving.keys[0]).toEqual({ keys: [K[0], K[1]], measures: 16 });
    // Nothing competes with drawing the opening: the whole text is asked for after it.
    await waitFor(() => expect(server.requests.some((r) => r.url === "/api/parts/part-1/markings")).toBe(true));
    expect(server.requests.filter((r) => r.url === "/api/parts/part-1/musicxml" || r.url === "/api/parts/part-1/note-keys")).toEqual([]);
    act(() => engraving.finish());
    // The opening's notes are selectable before the whole text has arrived.
    await waitFor(() => expect(hit(K[0])).not.toBeNull());
    await waitFor(() => expect(server.requests.filter((r) => r.url === "/api/parts/part-1/musicxml")).toHaveLength(1));
    act(() => server.sendText());
    await waitFor(() => expect(engraving.given.at(-1)).toEqual({ xml: "<score-partwise/>", opening: "<score-partwise><!-- the first bars --></score-partwise>" }));
    // The whole list came with the whole text and replaces the opening's.
    await waitFor(() => expect(engraving.keys.at(-1)).toEqual({ keys: fakeBoxes.map((b) => b.key) }));
  });

  it("asks for the analysis, history, comments and notifications only once the score is drawn", async () => {
    engraving.hold = true;
    open();
    await screen.findByTestId("score");
    // The markings and the text come first (the page carries them); nothing else competes with the engraving.
    await waitFor(() => expect(server.requests.some((r) => r.url === "/api/parts/part-1/markings")).toBe(true));
    const later = ["/api/parts/part-1/analysis", "/api/parts/part-1/history", "/api/parts/part-1/comments/summary", "/api/notifications?partId=part-1"];
    expect(server.requests.filter((r) => later.includes(r.url))).toEqual([]);
    act(() => engraving.finish());
    await waitFor(() => expect(later.filter((u) => !server.requests.some((r) => r.url === u))).toEqual([]));
    await waitFor(() => expect(within(screen.getByRole("tab", { name: /Suggestions/ })).queryByTestId("count-badge")).not.toBeNull());
  });

  it("shows the suggestions still to decide as a count badge on the tab, kept in its name", async () => {
    open();
    const tab = await screen.findByRole("tab", { name: /Suggestions/ });
    await waitFor(() => expect(within(tab).queryByTestId("count-badge")).not.toBeNull());
    expect(within(tab).getByTestId("count-badge").textContent).toBe("1");
    expect(tab.textContent).not.toMatch(/\(/);
    expect(screen.getByRole("tab", { name: "Suggestions 1 to decide" })).toBe(tab);
    // The toolbar's button too, its name starting with its visible label (WCAG 2.1 SC 2.5.3).
    expect(screen.getByRole("button", { name: "Suggestions 1 to decide" })).toBeTruthy();
  });

  it("marks a clicked note, draws it and saves it with no version (new)", async () => {
    open();
    await waitFor(() => expect(hit(K[1])).toBeTruthy());
    fireEvent.click(hit(K[1]));
    expect(screen.getByRole("heading", { name: "Bar 1 · D5" })).toBeTruthy();
    await setDepth("45");
    await waitFor(() => expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[1]}"]`)).not.toBeNull());
    await waitFor(() => expect(saveState()).toBe("saved"));
    const put = server.requests.find((r) => r.method === "PUT")!;
    expect(put.url).toBe(`/api/parts/part-1/markings/${encodeURIComponent(K[1])}`);
    expect(put.body).toMatchObject({ depthCents: 45, speedHz: 5.5 });
    expect((put.body as { version?: number }).version).toBeUndefined();
    expect(server.markings.get(K[1])?.version).toBe(1);
  });

  it("sends the version it got back with the next edit of the same note", async () => {
    open();
    await waitFor(() => expect(hit(K[0])).toBeTruthy());
    fireEvent.click(hit(K[0]));
    await setDepth("30");
    await setDepth("60");
    await waitFor(() => expect(server.markings.get(K[0])?.depthCents).toBe(60));
    const puts = server.requests.filter((r) => r.method === "PUT").map((r) => (r.body as { version?: number }).version);
    expect(puts).toEqual([undefined, 1]);
    await waitFor(() => expect(saveState()).toBe("saved"));
  });

  it("applies a change to the whole selection as one group", async () => {
    open();
    await waitFor(() => expect(hit(K[0])).toBeTruthy());
    fireEvent.click(hit(K[0]));
    fireEvent.click(hit(K[2]), { shiftKey: true });
    fireEvent.click(screen.getByRole("radio", { name: /Peak/ }));
    await waitFor(() => expect(server.markings.size).toBe(3));
    const groups = new Set(server.requests.filter((r) => r.method === "PUT").map((r) => (r.body as { group: string }).group));
    expect(groups.size).toBe(1);
  });

  it("shows both versions when the note changed elsewhere, and keeps mine only when asked", async () => {
    server.set(K[0], { depthCents: 10, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", role: null, comment: "" });
    open();
    await waitFor(() => expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[0]}"]`)).not.toBeNull());
    // Another tab saves first.
    server.set(K[0], { depthCents: 80 });
    fireEvent.click(hit(K[0]));
    await setDepth("25");
    const prompt = await screen.findByTestId("conflict-prompt");
    await waitFor(() => expect(within(prompt).getByText("Mine")).toBeTruthy());
    expect(within(prompt).getByText("25¢")).toBeTruthy();
    expect(within(prompt).getByText("80¢")).toBeTruthy();
    expect(saveState()).toBe("conflict");
    expect(server.markings.get(K[0])?.depthCents).toBe(80); // nothing overwritten yet
    fireEvent.click(within(prompt).getByRole("button", { name: "Keep mine" }));
    await waitFor(() => expect(server.markings.get(K[0])?.depthCents).toBe(25));
    const last = server.requests.filter((r) => r.method === "PUT").at(-1)!;
    expect((last.body as { version: number }).version).toBe(2);
    await waitFor(() => expect(saveState()).toBe("saved"));
  });

  it("takes the current version when asked, writing nothing", async () => {
    server.set(K[0], { depthCents: 10, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", role: null, comment: "" });
    open();
    await waitFor(() => expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[0]}"]`)).not.toBeNull());
    server.set(K[0], { depthCents: 80 });
    fireEvent.click(hit(K[0]));
    await setDepth("25");
    const prompt = await screen.findByTestId("conflict-prompt");
    await waitFor(() => expect(within(prompt).getByRole("button", { name: "Take current" })).toBeTruthy());
    const puts = server.requests.filter((r) => r.method === "PUT").length;
    fireEvent.click(within(prompt).getByRole("button", { name: "Take current" }));
    await waitFor(() => expect(saveState()).toBe("saved"));
    expect(server.requests.filter((r) => r.method === "PUT").length).toBe(puts);
    expect((screen.getByLabelText(/^Depth$/, { selector: "input" }) as HTMLInputElement).value).toBe("80");
  });

  it("accepts a suggested leading tone, then undoes it from the server's history", async () => {
    open();
    await screen.findByText("B is the leading tone of C major; it rises to C.");
    await waitFor(() => expect(document.querySelector(`[data-glyph="suggestion"][data-note-key="${K[3]}"]`)).not.toBeNull());
    fireEvent.click(screen.getByRole("button", { name: /Accept tension tone/ }));
    await waitFor(() => expect(server.markings.get(K[3])?.role).toBe("tension"));
    expect(server.requests.some((r) => r.method === "POST" && r.url.endsWith("/suggestions/decisions"))).toBe(true);
    expect(document.querySelector(`[data-glyph="role"][data-note-key="${K[3]}"]`)).not.toBeNull();
    const undo = await screen.findByRole("button", { name: "Undo (Ctrl+Z)" });
    await waitFor(() => expect((undo as HTMLButtonElement).disabled).toBe(false));
    act(() => {
      window.dispatchEvent(new KeyboardEvent("keydown", { key: "z", ctrlKey: true }));
    });
    await waitFor(() => expect(document.querySelector(`[data-glyph="role"][data-note-key="${K[3]}"]`)).toBeNull());
    expect(server.markings.has(K[3])).toBe(false);
    // Undone, the suggestion waits again.
    await waitFor(() => expect(document.querySelector(`[data-glyph="suggestion"][data-note-key="${K[3]}"]`)).not.toBeNull());
  });

  it("accepts a suggestion and opens its note in the marking panel to edit it", async () => {
    open();
    await screen.findByText("B is the leading tone of C major; it rises to C.");
    fireEvent.click(screen.getByRole("button", { name: /Accept and edit tension tone/ }));
    await waitFor(() => expect(server.markings.get(K[3])?.role).toBe("tension"));
    expect(server.requests.some((r) => r.method === "POST" && r.url.endsWith("/suggestions/decisions") && (r.body as { decision: string }).decision === "accepted")).toBe(true);
    const panel = await screen.findByTestId("marking-panel");
    expect(within(panel).getByRole("heading", { level: 2 }).textContent).toBe("Bar 3 · B4");
    expect(within(panel).getByRole("radio", { name: /Tension tone/ })).toHaveProperty("checked", true);
    // Edited there like any marking: the depth goes out with the version the acceptance got back.
    await setDepth("25");
    await waitFor(() => expect(server.markings.get(K[3])?.depthCents).toBe(25));
    expect(server.markings.get(K[3])?.role).toBe("tension");
  });

  it("moves from note to note with the keyboard and opens the panel with Enter", async () => {
    open();
    await waitFor(() => expect(hit(K[0])).toBeTruthy());
    const score = screen.getByRole("group", { name: /Score of/ });
    fireEvent.keyDown(score, { key: "ArrowRight" });
    fireEvent.keyDown(score, { key: "ArrowRight" });
    fireEvent.keyDown(score, { key: "ArrowRight", shiftKey: true });
    expect(document.querySelector('[data-focus="true"]')!.getAttribute("data-selected")).toBe(K[2]);
    expect(screen.getByTestId("note-announcer").textContent).toMatch(/Bar 2 · E5, not marked\. 2 notes selected/);
    fireEvent.keyDown(score, { key: "Enter" });
    expect(screen.getByRole("heading", { name: "2 notes, bars 1–2" })).toBeTruthy();
    fireEvent.keyDown(score, { key: "Escape" });
    expect(document.querySelector('[data-focus="true"]')).toBeNull();
  });

  it("offers Upper and Lower on a staff with two players, and the suggestions follow the line chosen", async () => {
    server.lowerAnalysis = {
      ...server.analysis,
      lines: { writtenAs: "voices", line: "lower" },
      suggestions: [{ note: K[1], measure: "1", pitch: "D5", role: "phrase-start", confidence: 0.8, resolvesTo: null, reason: "A phrase begins on D in bar 1." }],
    };
    open();
    await screen.findByText("B is the leading tone of C major; it rises to C.");
    const group = await screen.findByRole("radiogroup", { name: "Line:" });
    expect((within(group).getByRole("radio", { name: "Upper" }) as HTMLInputElement).checked).toBe(true);
    fireEvent.click(within(group).getByRole("radio", { name: "Lower" }));
    await screen.findByText("A phrase begins on D in bar 1.");
    expect(screen.queryByText("B is the leading tone of C major; it rises to C.")).toBeNull();
    expect(server.requests).toEqual(expect.arrayContaining([expect.objectContaining({ method: "PATCH", url: "/api/parts/part-1", body: { line: "lower" } })]));
    expect(server.requests.some((r) => r.url === "/api/parts/part-1/analysis?line=lower")).toBe(true);
    expect((within(screen.getByRole("radiogroup", { name: "Line:" })).getByRole("radio", { name: "Lower" }) as HTMLInputElement).checked).toBe(true);
  });

  it("offers no line on a staff with one player", async () => {
    open();
    await screen.findByText("B is the leading tone of C major; it rises to C.");
    expect(screen.queryByRole("radiogroup", { name: "Line:" })).toBeNull();
  });

  it("keeps an edit through a 503, says it is not saved yet, waits as Retry-After asks, and saves it when the server is back", async () => {
    open();
    await waitFor(() => expect(hit(K[1])).toBeTruthy());
    server.writesDown = { retryAfter: 1 };
    fireEvent.click(hit(K[1]));
    await setDepth("45");
    await waitFor(() => expect(saveState()).toBe("unsaved"));
    expect(saveText()).toMatch(/Not saved yet · trying again · 1 change/);
    // The edit stays on the page, and leaving it would warn.
    expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[1]}"]`)).not.toBeNull();
    expect(leavingWarns()).toBe(true);
    await waitFor(() => expect(puts().length).toBeGreaterThanOrEqual(2), { timeout: 4000 });
    const [first, second] = puts();
    expect(second.at - first.at).toBeGreaterThanOrEqual(1000); // Retry-After: 1 (RFC 9110 §10.2.3)
    expect(server.markings.has(K[1])).toBe(false);
    server.writesDown = null;
    await waitFor(() => expect(saveState()).toBe("saved"), { timeout: 8000 });
    expect(server.markings.get(K[1])?.depthCents).toBe(45);
    expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[1]}"]`)).not.toBeNull();
    expect(leavingWarns()).toBe(false);
  }, 15_000);

  it("keeps every edit made while the network is gone and saves them all, in order, when it answers again", async () => {
    open();
    await waitFor(() => expect(hit(K[0])).toBeTruthy());
    server.writesDown = "network";
    fireEvent.click(hit(K[0]));
    await setDepth("30");
    await waitFor(() => expect(saveState()).toBe("unsaved"));
    await setDepth("60");
    fireEvent.click(hit(K[2]));
    await setDepth("35");
    await waitFor(() => expect(saveText()).toMatch(/3 changes/));
    server.writesDown = null;
    await waitFor(() => expect(saveState()).toBe("saved"), { timeout: 8000 });
    expect(server.markings.get(K[0])?.depthCents).toBe(60);
    expect(server.markings.get(K[2])?.depthCents).toBe(35);
    // The second edit of K[0] went out with the version the first one got back: no conflict.
    expect(screen.queryByRole("button", { name: "Keep mine" })).toBeNull();
  }, 15_000);

  it("waits while the browser is offline, sends nothing, and saves as soon as it is back online", async () => {
    open();
    await waitFor(() => expect(hit(K[1])).toBeTruthy());
    act(() => onlineManager.setOnline(false));
    expect(saveState()).toBe("offline");
    fireEvent.click(hit(K[1]));
    await setDepth("45");
    await waitFor(() => expect(saveState()).toBe("unsaved"));
    expect(saveText()).toMatch(/Not saved yet · offline · 1 change/);
    expect(puts()).toHaveLength(0);
    expect(leavingWarns()).toBe(true);
    act(() => onlineManager.setOnline(true));
    await waitFor(() => expect(saveState()).toBe("saved"));
    expect(server.markings.get(K[1])?.depthCents).toBe(45);
  });

  it("takes a retried write whose first try landed (its answer lost) as saved, not as a conflict", async () => {
    open();
    await waitFor(() => expect(hit(K[1])).toBeTruthy());
    server.answersLost = 1;
    fireEvent.click(hit(K[1]));
    await setDepth("45");
    await waitFor(() => expect(puts()).toHaveLength(2), { timeout: 4000 });
    await waitFor(() => expect(saveState()).toBe("saved"));
    expect(screen.queryByRole("button", { name: "Keep mine" })).toBeNull();
    expect(server.markings.get(K[1])).toMatchObject({ depthCents: 45, version: 1 });
    // The next edit goes on from that version.
    await setDepth("50");
    await waitFor(() => expect(server.markings.get(K[1])?.depthCents).toBe(50));
    expect(screen.queryByRole("button", { name: "Keep mine" })).toBeNull();
  }, 10_000);

  it("still sends a refused write (409) to the conflict prompt rather than retrying it", async () => {
    server.set(K[0], { depthCents: 10, speedHz: 5, placement: "centered", onset: "immediate", shape: "steady", role: null, comment: "" });
    open();
    await waitFor(() => expect(document.querySelector(`[data-glyph="wave"][data-note-key="${K[0]}"]`)).not.toBeNull());
    server.set(K[0], { depthCents: 80 });
    fireEvent.click(hit(K[0]));
    await setDepth("25");
    await screen.findByTestId("conflict-prompt");
    await new Promise((r) => setTimeout(r, 1500));
    expect(puts()).toHaveLength(1);
    expect(saveState()).toBe("conflict");
    expect(leavingWarns()).toBe(true);
  }, 10_000);
});
