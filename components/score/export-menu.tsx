"use client";

import Link from "next/link";
import { useRef } from "react";

/** Downloads of the part with its markings, and the stand copy. */
export function ExportMenu({ partId }: { partId: string }) {
  const ref = useRef<HTMLDetailsElement>(null);
  const close = () => ref.current?.removeAttribute("open");
  const item = "flex min-h-11 items-center rounded px-3 text-sm hover:bg-paper-deep focus-visible:bg-paper-deep";
  return (
    <details ref={ref} className="relative" data-testid="export-menu" onKeyDown={(e) => e.key === "Escape" && close()}>
      <summary className="flex h-11 cursor-pointer list-none items-center rounded px-2.5 text-sm font-medium text-ink hover:bg-paper-deep [&::-webkit-details-marker]:hidden">
        Export ▾
      </summary>
      <div className="absolute right-0 z-30 mt-1 w-72 rounded border border-rule bg-paper-card p-1 shadow-[0_4px_16px_rgba(27,26,23,0.15)]" role="group" aria-label="Export">
        <a className={item} href={`/api/parts/${partId}/export?format=musicxml`} download onClick={close}>
          MusicXML with markings
        </a>
        <a className={item} href={`/api/parts/${partId}/export?format=midi`} download onClick={close}>
          MIDI with vibrato
        </a>
        <Link className={item} href={`/parts/${partId}/print`} onClick={close}>
          Stand copy (print, PDF)
        </Link>
      </div>
    </details>
  );
}
