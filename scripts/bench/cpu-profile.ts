/**
 * A sampled CPU profile of one page load, summarised by self time per function, so a bench run
 * can say where the time between navigation and a ready page goes. Used when BENCH_PROFILE is set.
 */
import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

export async function profileLoad(page: Page, load: () => Promise<void>, name: string): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Profiler.enable");
  await cdp.send("Profiler.setSamplingInterval", { interval: 200 });
  await cdp.send("Profiler.start");
  await load();
  const { profile } = (await cdp.send("Profiler.stop")) as unknown as { profile: Profile };
  await cdp.detach();
  const dir = path.resolve("test-results", "bench");
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.cpuprofile`);
  fs.writeFileSync(file, JSON.stringify(profile));
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const self = new Map<string, number>();
  const byFile = new Map<string, number>();
  profile.samples.forEach((id, i) => {
    const node = byId.get(id);
    if (!node) return;
    const f = node.callFrame;
    const label = `${f.functionName || "(anonymous)"} ${path.basename(f.url.split("?")[0]) || ""}:${f.lineNumber}`;
    const ms = (profile.timeDeltas[i] ?? 0) / 1000;
    self.set(label, (self.get(label) ?? 0) + ms);
    const fileName = path.basename(f.url.split("?")[0]) || f.functionName || "(native)";
    byFile.set(fileName, (byFile.get(fileName) ?? 0) + ms);
  });
  const top = [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, 25);
  console.log(`CPU profile ${name} (${file}); self time, ms:`);
  for (const [label, ms] of top) console.log(`  ${ms.toFixed(1).padStart(7)}  ${label}`);
  console.log("  by file:");
  for (const [label, ms] of [...byFile.entries()].sort((a, b) => b[1] - a[1]).slice(0, 10)) console.log(`  ${ms.toFixed(1).padStart(7)}  ${label}`);
}
