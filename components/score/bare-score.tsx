"use client";

import { ENGRAVING_OPTIONS } from "./engraving-options";
import { useLayoutEffect, useRef, useState } from "react";

/**
 * The benchmark's baseline: the same normalized text engraved by OpenSheetMusicDisplay with the
 * workspace's options, and nothing of ours (no keys, overlay, store or panels).
 */
export function BareScore({ xml }: { xml: string }) {
  const host = useRef<HTMLDivElement>(null);
  const [ready, setReady] = useState(false);
  // The same start as the workspace (a layout effect), so the two differ only by our own work.
  useLayoutEffect(() => {
    let cancelled = false;
    (async () => {
      // The same stage marks as the workspace, for the benchmark's side-by-side.
      performance.mark("ondula:engraver-import");
      const { OpenSheetMusicDisplay } = await import("opensheetmusicdisplay");
      performance.mark("ondula:engraver-loaded");
      const el = host.current;
      if (cancelled || !el) return;
      const osmd = new OpenSheetMusicDisplay(el, { ...ENGRAVING_OPTIONS });
      await osmd.load(xml);
      performance.mark("ondula:loaded");
      if (cancelled) return;
      osmd.render();
      performance.mark("ondula:rendered");
      setReady(true);
    })();
    return () => {
      cancelled = true;
    };
  }, [xml]);
  return <div ref={host} data-bare-ready={ready ? "true" : "false"} />;
}
