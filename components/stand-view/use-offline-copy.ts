"use client";

import { useEffect, useState } from "react";
import { WORKER_SCOPE, WORKER_URL, filesToKeep } from "@/lib/stand-view/offline";

const PROBE_TIMEOUT_MS = 4000;

export type OfflineState = "saving" | "saved" | "offline" | "unsupported" | "failed";

/** Sends a message to the worker and waits for its answer (Serwist answers CACHE_URLS on the port). */
function ask(worker: ServiceWorker, message: unknown): Promise<void> {
  return new Promise((resolve, reject) => {
    const channel = new MessageChannel();
    const timer = setTimeout(() => reject(new Error("The offline copy took too long.")), 20_000);
    channel.port1.onmessage = () => {
      clearTimeout(timer);
      resolve();
    };
    worker.postMessage(message, [channel.port2]);
  });
}

/** The registration's worker once it is active (installing and activating take a moment the first time). */
function activeWorker(registration: ServiceWorkerRegistration): Promise<ServiceWorker> {
  if (registration.active) return Promise.resolve(registration.active);
  const pending = registration.installing ?? registration.waiting;
  if (!pending) return Promise.reject(new Error("The service worker did not install."));
  return new Promise((resolve, reject) => {
    pending.addEventListener("statechange", () => {
      if (pending.state === "activated") resolve(pending);
      else if (pending.state === "redundant") reject(new Error("The service worker did not install."));
    });
  });
}

/**
 * Once the part is drawn (every script, style and font it needs has loaded), registers the
 * stand view's service worker and hands it this page and those files to keep, so the view opens
 * again without a network. Offline, it only says so.
 */
export function useOfflineCopy(ready: boolean): OfflineState {
  const [state, setState] = useState<OfflineState>("saving");
  // Whether the server answers: `navigator.onLine` says only that some network is there (and a
  // kept copy can open on a network that does not reach us). Any answer, even 401, will do.
  const [reachable, setReachable] = useState<boolean | null>(null);
  useEffect(() => {
    let live = true;
    const probe = async () => {
      const ok = navigator.onLine
        ? await fetch("/api/me", { cache: "no-store", signal: AbortSignal.timeout(PROBE_TIMEOUT_MS) }).then(
            () => true,
            () => false,
          )
        : false;
      if (!live) return;
      setReachable(ok);
      if (!ok) setState("offline");
    };
    void probe();
    const lost = () => {
      setReachable(false);
      setState("offline");
    };
    window.addEventListener("offline", lost);
    return () => {
      live = false;
      window.removeEventListener("offline", lost);
    };
  }, []);

  useEffect(() => {
    if (!ready || !reachable) return;
    if (!("serviceWorker" in navigator) || !window.isSecureContext) {
      setState("unsupported");
      return;
    }
    let live = true;
    (async () => {
      try {
        const registration = await navigator.serviceWorker.register(WORKER_URL, { scope: WORKER_SCOPE, type: "module" });
        // Not `navigator.serviceWorker.ready`: it waits for a worker of the scope the document was
        // opened in, and a page reached by a client-side link may have been opened outside /parts/.
        const worker = await activeWorker(registration);
        const files = filesToKeep(
          performance.getEntriesByType("resource").map((e) => e.name),
          location.origin,
        );
        await ask(worker, { type: "CACHE_URLS", payload: { urlsToCache: [location.origin + location.pathname, ...files] } });
        if (live) setState("saved");
      } catch {
        if (live) setState("failed");
      }
    })();
    return () => {
      live = false;
    };
  }, [ready, reachable]);
  return state;
}
