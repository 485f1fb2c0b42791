import "server-only";
import { AppError } from "@/lib/errors";
import type { Part } from "@/db/schema";

/** A note named in a request body must be a note of the part (a stale tab may hold old keys). */
export function assertNoteOfPart(part: Part, noteKey: string | null | undefined) {
  if (noteKey && !part.noteKeys.includes(noteKey)) {
    throw new AppError("bad_request:note", `There is no note ${noteKey} in this part. Reload the page: the part may have changed.`, { field: "noteKey" });
  }
}
