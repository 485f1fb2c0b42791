/**
 * `npm run bench -- --only load`: 50 concurrent savers (10 players × 5 notes each) for 30 s,
 * with PostgreSQL stopped and started again after 10 s, and a few readers of GET /api/me in the
 * same crowd as the baseline. Prints acknowledged writes lost, status codes per second, the
 * recovery time, and p50/p95 of saves next to /api/me measured over the same seconds.
 * Requests go only to this machine's loopback address, are bounded in time and stop by themselves.
 */
import path from "node:path";
import { performance } from "node:perf_hooks";
import { and, eq } from "drizzle-orm";
import type { BenchSection } from "./index";
import { percentile } from "./util";
import { generatePartXml } from "./generate-part";
import { db } from "../../db/client";
import { markings } from "../../db/schema";
import { DEFAULT_MARKING } from "../../lib/markings/schema";
import { createSignedInUser, type ApiClient } from "../../tests/helpers/session";
import { multipartFile } from "../../tests/helpers/parts";
// @ts-expect-error -- plain JavaScript helper shared with scripts/run.mjs
import { startCluster, stopCluster } from "../pg.mjs";

const SAVERS_PER_PLAYER = 5;
const PLAYERS = 10;
const READERS = 5;
const DURATION_MS = Number(process.env.BENCH_LOAD_MS ?? 30_000);
const OUTAGE_AT_MS = DURATION_MS / 3;

interface Sample { at: number; ms: number; status: number; kind: "save" | "me" }

const section: BenchSection = {
  name: "load",
  async run() {
    const dbUrl = new URL(process.env.DATABASE_URL!);
    const dir = path.resolve(".data/pg-bench");
    const xml = new TextEncoder().encode(generatePartXml({ measures: 8, seed: 11 }));
    const players: Array<{ client: ApiClient; partId: string; keys: string[] }> = [];
    for (let i = 0; i < PLAYERS; i++) {
      const { client } = await createSignedInUser();
      const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile(`load-${i}.musicxml`, xml) });
      const { id } = await res.json();
      const analysis = await (await client.fetch(`/api/parts/${id}/analysis`)).json();
      players.push({ client, partId: id, keys: analysis.notes.slice(0, SAVERS_PER_PLAYER).map((n: { key: string }) => n.key) });
    }

    const samples: Sample[] = [];
    const acked = new Map<string, number>(); // partId|noteKey → highest acknowledged depth
    const t0 = performance.now();
    const now = () => performance.now() - t0;
    let restartedAt = NaN;
    const end = DURATION_MS;

    async function saver(client: ApiClient, partId: string, key: string) {
      let depth = 0;
      while (now() < end) {
        depth = (depth % 100) + 1;
        const start = now();
        let status = 0;
        try {
          const res = await client.fetch(`/api/parts/${partId}/markings/${encodeURIComponent(key)}`, {
            method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ ...DEFAULT_MARKING, depthCents: depth, comment: String(start) }),
          });
          status = res.status;
          await res.arrayBuffer();
        } catch {
          status = 0;
        }
        samples.push({ at: start, ms: now() - start, status, kind: "save" });
        if (status === 200) acked.set(`${partId}|${key}`, start);
        else await new Promise((r) => setTimeout(r, 200));
      }
    }
    async function reader(client: ApiClient) {
      while (now() < end) {
        const start = now();
        let status = 0;
        try {
          const res = await client.fetch("/api/me");
          status = res.status;
          await res.arrayBuffer();
        } catch {
          status = 0;
        }
        samples.push({ at: start, ms: now() - start, status, kind: "me" });
        if (status !== 200) await new Promise((r) => setTimeout(r, 200));
      }
    }
    const outage = (async () => {
      await new Promise((r) => setTimeout(r, OUTAGE_AT_MS));
      stopCluster(dir);
      startCluster({ dir, port: Number(dbUrl.port), database: dbUrl.pathname.slice(1), user: "ondula", password: "ondula", fast: true, recreateDatabase: false });
      restartedAt = now();
    })();
    await Promise.all([
      ...players.flatMap((p) => p.keys.map((k) => saver(p.client, p.partId, k))),
      ...players.slice(0, READERS).map((p) => reader(p.client)),
      outage,
    ]);

    // Every acknowledged save must be in the database: the stored comment is the start time of
    // the last save that reached it, never older than the last acknowledged one.
    let lost = 0;
    for (const [k, ackedAt] of acked) {
      const [partId, noteKey] = k.split("|");
      const [row] = await db().select({ comment: markings.comment }).from(markings).where(and(eq(markings.partId, partId), eq(markings.noteKey, noteKey)));
      if (!row || Number(row.comment) < ackedAt) lost++;
    }

    const perSecond = new Map<number, Record<string, number>>();
    for (const s of samples) {
      const sec = Math.floor(s.at / 1000);
      const row = perSecond.get(sec) ?? {};
      row[String(s.status)] = (row[String(s.status)] ?? 0) + 1;
      perSecond.set(sec, row);
    }
    console.log("status codes per second (all requests):");
    for (const [sec, row] of [...perSecond].sort((a, b) => a[0] - b[0])) {
      console.log(`  ${String(sec).padStart(3)} s  ${Object.entries(row).map(([k, v]) => `${k}×${v}`).join("  ")}`);
    }
    const failedAfterOutage = samples.filter((s) => s.at > restartedAt && s.status !== 200);
    const firstOk = samples.filter((s) => s.at > restartedAt && s.status === 200 && s.kind === "save").sort((a, b) => a.at - b.at)[0];
    const lastBad = samples.filter((s) => s.status !== 200).sort((a, b) => b.at - a.at)[0];
    const non2xx = new Map<number, number>();
    for (const s of samples) if (s.status !== 200) non2xx.set(s.status, (non2xx.get(s.status) ?? 0) + 1);
    // Latency outside the outage window (the outage's own answers are fast 503s or timeouts).
    const outsideOutage = (s: Sample) => s.status === 200 && (s.at < OUTAGE_AT_MS - 100 || (lastBad ? s.at > lastBad.at : true));
    const saves = samples.filter((s) => s.kind === "save" && outsideOutage(s)).map((s) => s.ms).sort((a, b) => a - b);
    const me = samples.filter((s) => s.kind === "me" && outsideOutage(s)).map((s) => s.ms).sort((a, b) => a - b);
    console.table([
      { measure: "acknowledged saves", value: acked.size ? samples.filter((s) => s.kind === "save" && s.status === 200).length : 0 },
      { measure: "acknowledged writes lost (goal 0)", value: lost },
      { measure: "non-2xx by status", value: [...non2xx].map(([k, v]) => `${k}×${v}`).join(" ") || "none" },
      { measure: "non-2xx after the restart", value: failedAfterOutage.length },
      { measure: "recovery: restart → first saved (ms)", value: firstOk ? Math.round(firstOk.at - restartedAt) : NaN },
      { measure: "recovery: restart → last failure (ms)", value: lastBad ? Math.round(lastBad.at - restartedAt) : 0 },
    ]);
    console.table([
      { measure: "GET /api/me (baseline)", n: me.length, "p50 ms": +percentile(me, 50).toFixed(1), "p95 ms": +percentile(me, 95).toFixed(1) },
      { measure: "PUT marking", n: saves.length, "p50 ms": +percentile(saves, 50).toFixed(1), "p95 ms": +percentile(saves, 95).toFixed(1) },
      { measure: "save p95 ÷ /api/me p95 (goal ≤ 3)", n: 0, "p50 ms": +(percentile(saves, 50) / percentile(me, 50)).toFixed(2), "p95 ms": +(percentile(saves, 95) / percentile(me, 95)).toFixed(2) },
    ]);
  },
};

export default section;
