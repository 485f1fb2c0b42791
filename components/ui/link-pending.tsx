"use client";

import { useLinkStatus } from "next/link";

/**
 * Said inside a link while the page it opens is on its way. A part's pages have no placeholder
 * page (`loading.tsx`): React reveals what streams in behind one no sooner than 300 ms after the
 * placeholder is painted, which held the first note back. The link itself tells the player it was
 * heard.
 */
export function LinkPending({ label = "opening…" }: { label?: string }) {
  const { pending } = useLinkStatus();
  return (
    <span aria-live="polite" className="ml-2 text-sm font-normal text-graphite">
      {pending ? label : ""}
    </span>
  );
}
