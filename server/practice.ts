import "server-only";
import { can } from "@/lib/auth/policy";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import type { PartAccess } from "@/db/parts";
import type { Part } from "@/db/schema";

/** A note named in a request body must be a note of the part (a stale tab may hold old keys). */
export function assertNoteOfPart(part: Part, noteKey: string | null | undefined) {
  if (noteKey && !part.noteKeys.includes(noteKey)) {
    throw new AppError("bad_request:note", `There is no note ${noteKey} in this part. Reload the page: the part may have changed.`, { field: "noteKey" });
  }
}

/** Whether the viewer may add to the part's practice log and takes (the policy decides). */
export function canWritePractice(user: CurrentUser, access: PartAccess): boolean {
  const { part, permission } = access;
  return can(user, "practice:write", { type: "part", part: { id: part.id, ownerId: part.ownerId }, share: permission === "owner" ? null : { permission } });
}
