/**
 * Upload-to-stored time for a 100-measure part, and the library API's latency with 200 parts,
 * each next to GET /api/health measured in the same run on the same server.
 */
import { performance } from "node:perf_hooks";
import type { BenchSection } from "./index";
import { percentile } from "./util";
import { createSignedInUser } from "../../tests/helpers/session";
import { multipartFile } from "../../tests/helpers/parts";
import { generatePartXml } from "./generate-part";

async function latencies(fn: () => Promise<Response>, n: number): Promise<number[]> {
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    const res = await fn();
    await res.arrayBuffer();
    if (!res.ok) throw new Error(`request failed with ${res.status}`);
    out.push(performance.now() - t0);
  }
  return out.sort((a, b) => a - b);
}

const section: BenchSection = {
  name: "library",
  async run() {
    const client = (await createSignedInUser({ role: "player" })).client;
    const appUrl = process.env.APP_URL ?? "http://127.0.0.1:3000";
    const health = await latencies(() => fetch(`${appUrl}/api/health`), 60);

    const xml = new TextEncoder().encode(generatePartXml({ measures: 100, seed: 7 }));
    const upload = await latencies(() => client.fetch("/api/parts", { method: "POST", body: multipartFile("bench-100.musicxml", xml) }), 12);

    // Fill the library to 200 parts, then page through it as a player would.
    const have = (await (await client.fetch("/api/parts?pageSize=1")).json()).total as number;
    const small = new TextEncoder().encode(generatePartXml({ measures: 8, seed: 3 }));
    for (let i = have; i < 200; i++) {
      const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile(`bench-${i}.musicxml`, small) });
      if (res.status !== 201) throw new Error(`seeding the library failed: ${res.status}`);
    }
    let page = 0;
    const sorts = ["-updated", "title", "-markings", "bars"];
    const list = await latencies(() => {
      page = (page % 10) + 1;
      return client.fetch(`/api/parts?sort=${sorts[page % sorts.length]}&page=${page}`);
    }, 100);
    const search = await latencies(() => client.fetch(`/api/parts?query=bench-1`), 50);

    const row = (name: string, xs: number[]) => ({
      measure: name,
      "p50 ms": +percentile(xs, 50).toFixed(1),
      "p95 ms": +percentile(xs, 95).toFixed(1),
      "p50 ÷ health p50": +(percentile(xs, 50) / percentile(health, 50)).toFixed(1),
    });
    console.table([
      row("GET /api/health (baseline)", health),
      row("upload → stored, 100 bars", upload),
      row("GET /api/parts, 200 parts, sorted pages", list),
      row("GET /api/parts?query=…, 200 parts", search),
    ]);
  },
};

export default section;
