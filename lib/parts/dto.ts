import type { PART_SORTS } from "./schemas";

/** Shapes the parts API sends, shared by the data layer and the browser. */
export type PartPermission = "owner" | "comment" | "propose";

export type PartSort = (typeof PART_SORTS)[number];

/** One row of the library. */
export interface ListedPart {
  id: string;
  title: string;
  composer: string;
  keyLabel: string;
  measureCount: number;
  noteCount: number;
  markingCount: number;
  sharedWith: string[];
  ownerName: string;
  isOwner: boolean;
  permission: PartPermission;
  sourceFileName: string;
  /** Bars read as written although they disagree with their time signature, in player's words. */
  notices: string[];
  updatedAt: string;
}
