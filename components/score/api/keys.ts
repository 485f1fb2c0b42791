/** Query keys, one factory per area, so invalidation and prefetching agree on the shapes. */
export const partKeys = {
  all: ["parts"] as const,
  detail: (partId: string) => ["parts", partId] as const,
  musicxml: (partId: string) => ["parts", partId, "musicxml"] as const,
  analysis: (partId: string) => ["parts", partId, "analysis"] as const,
};

export const markingKeys = {
  all: (partId: string) => ["parts", partId, "markings"] as const,
  list: (partId: string) => ["parts", partId, "markings", "list"] as const,
  /** Mutation key of every marking write of a part (for the save state). */
  write: (partId: string) => ["parts", partId, "markings", "write"] as const,
  /** Scope that runs a part's writes, undo and redo one after another, in order. */
  scope: (partId: string) => `markings:${partId}`,
};

export const historyKeys = {
  list: (partId: string) => ["parts", partId, "history"] as const,
};

export const decisionKeys = {
  list: (partId: string) => ["parts", partId, "suggestions", "decisions"] as const,
};
