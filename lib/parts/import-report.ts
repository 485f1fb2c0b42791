/** What an upload answers about the Ondula markings it found in the file (lib/export/README.md). */
export interface MarkingImport {
  importedMarkings: number;
  /**
   * Marking records in the file that could not be read, with the note they sat on and where a
   * player finds it ("D5 in bar 3", named by the server from the part's written bar numbers).
   */
  unreadableMarkings: Array<{ noteKey: string; reason: string; where?: string }>;
}

/** At most this many unreadable records are named one by one; the rest are counted. */
const NAMED = 3;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The sentences that tell a player what came in with their file: null for a file without
 * Ondula markings (nothing to say), else a headline and, when some records could not be read,
 * which notes they were on and why, so nothing is silently dropped.
 */
export function describeMarkingImport({ importedMarkings, unreadableMarkings }: MarkingImport): { headline: string; details: string | null } | null {
  if (importedMarkings === 0 && unreadableMarkings.length === 0) return null;
  const headline =
    importedMarkings > 0
      ? `Imported ${plural(importedMarkings, "marking", "markings")} from the file.`
      : "No markings could be imported from the file.";
  if (unreadableMarkings.length === 0) return { headline, details: null };
  const named = unreadableMarkings.slice(0, NAMED).map((u) => `${u.where ?? "a note"} (${u.reason.replace(/\.$/, "")})`);
  const more = unreadableMarkings.length - named.length;
  const details =
    `${plural(unreadableMarkings.length, "marking record", "marking records")} could not be read and ${unreadableMarkings.length === 1 ? "was" : "were"} left out: ` +
    `${named.join("; ")}${more > 0 ? `; and ${more} more` : ""}.`;
  return { headline, details };
}
