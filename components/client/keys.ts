/**
 * Query keys, one factory per resource, so that invalidation and prefetching agree on the shapes.
 * Everything about one part sits under `["parts", partId]`: invalidating that prefix refreshes the
 * whole part. A part's id is a UUID, so it never collides with `list` or `samples`.
 */
export const partKeys = {
  all: ["parts"] as const,
  lists: () => ["parts", "list"] as const,
  list: (p: { query: string; sort: string; page: number }) => ["parts", "list", p] as const,
  samples: () => ["parts", "samples"] as const,
  detail: (partId: string) => ["parts", partId] as const,
  musicxml: (partId: string) => ["parts", partId, "musicxml"] as const,
  /** The chosen part's note keys as the server keys them (what a marking may attach to). */
  noteKeys: (partId: string) => ["parts", partId, "note-keys"] as const,
  /** The analysis on a line of a two-player staff; "chosen" = the player's line as stored. */
  analysis: (partId: string, line: "upper" | "lower" | "chosen" = "chosen") => ["parts", partId, "analysis", line] as const,
};

export const markingKeys = {
  all: (partId: string) => ["parts", partId, "markings"] as const,
  list: (partId: string) => ["parts", partId, "markings", "list"] as const,
  /** Mutation key of every marking write of a part (for the save state). */
  write: (partId: string) => ["parts", partId, "markings", "write"] as const,
  /** Scope that runs a part's writes, undo and redo one after another, in order. */
  scope: (partId: string) => `markings:${partId}`,
  /** Client-only entries (never fetched): what the write queue learnt from the server. */
  conflicts: (partId: string) => ["parts", partId, "markings", "conflicts"] as const,
  versions: (partId: string) => ["parts", partId, "markings", "versions"] as const,
  saveError: (partId: string) => ["parts", partId, "markings", "save-error"] as const,
};

export const historyKeys = {
  list: (partId: string) => ["parts", partId, "history"] as const,
};

export const decisionKeys = {
  list: (partId: string) => ["parts", partId, "suggestions", "decisions"] as const,
};

export const shareKeys = {
  list: (partId: string) => ["parts", partId, "shares"] as const,
};

export const commentKeys = {
  thread: (partId: string, threadKey: string) => ["parts", partId, "threads", threadKey] as const,
  summary: (partId: string) => ["parts", partId, "thread-summary"] as const,
};

export const proposalKeys = {
  list: (partId: string) => ["parts", partId, "proposals"] as const,
};

export const assignmentKeys = {
  list: (partId: string) => ["parts", partId, "assignments"] as const,
};

export const practiceKeys = {
  log: (partId: string) => ["parts", partId, "practice"] as const,
  takes: (partId: string) => ["parts", partId, "takes"] as const,
};

export const notificationKeys = {
  all: ["notifications"] as const,
  list: (partId?: string) => ["notifications", partId ?? "all"] as const,
};

export const sharedPartKeys = {
  all: ["shared-parts"] as const,
};
