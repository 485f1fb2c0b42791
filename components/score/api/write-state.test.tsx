import { QueryClient } from "@tanstack/react-query";
import { describe, expect, it } from "vitest";
import { DEFAULT_MARKING } from "@/lib/markings/schema";
import { K, marking } from "../test-fixtures";
import { addConflict, conflictsOf, resolveConflict, updateConflictMine } from "./write-state";

describe("write state in the query cache", () => {
  it("keeps one conflict per note and lets it be resolved", () => {
    const client = new QueryClient();
    addConflict(client, "p", { noteKey: K[0], mine: DEFAULT_MARKING, current: marking(K[0], { version: 2 }) });
    addConflict(client, "p", { noteKey: K[0], mine: { ...DEFAULT_MARKING, depthCents: 70 }, current: marking(K[0], { version: 3 }) });
    expect(conflictsOf(client, "p")).toHaveLength(1);
    expect(conflictsOf(client, "p")[0].current?.version).toBe(3);
    updateConflictMine(client, "p", K[0], null);
    expect(conflictsOf(client, "p")[0].mine).toBeNull();
    resolveConflict(client, "p", K[0]);
    expect(conflictsOf(client, "p")).toEqual([]);
  });
});
