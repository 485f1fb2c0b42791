import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type BrowserContext } from "playwright-core";

/** Flags that keep Debian's Chromium quiet on a closed network (see the stack notes). */
export const CHROMIUM_FLAGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export const OUTPUT_DIR = path.resolve("test-results", "e2e");

/**
 * A fresh Chromium profile per context; close it with `context.close()`. `args` adds flags, e.g.
 * the fake microphone ones (`--use-file-for-fake-audio-capture=<wav>`).
 */
export async function launchContext(options: { width?: number; height?: number; args?: string[] } = {}): Promise<BrowserContext> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "ondula-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [...CHROMIUM_FLAGS, ...(options.args ?? [])],
    viewport: { width: options.width ?? 1280, height: options.height ?? 860 },
  });
  // Chromium may still be flushing its profile when the context closes; retry, never throw.
  context.on("close", () => {
    setTimeout(() => fs.rm(profile, { recursive: true, force: true, maxRetries: 5, retryDelay: 200 }, () => {}), 500);
  });
  return context;
}

export function screenshotPath(name: string): string {
  fs.mkdirSync(OUTPUT_DIR, { recursive: true });
  return path.join(OUTPUT_DIR, `${name}.png`);
}

/**
 * One headless Chromium for a suite that opens many contexts (one per signed-in person): cheaper
 * than a browser per context. Close it with `browser.close()`.
 */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: CHROMIUM_FLAGS });
}
