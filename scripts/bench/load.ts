/**
 * `npm run bench -- --only load`: 50 concurrent savers (10 players × 5 notes each) for 30 s,
 * with PostgreSQL stopped (held down `BENCH_OUTAGE_MS`, 1 s) and started again after a third of
 * the run, and a few readers of GET /api/me in the same crowd as the baseline. Before the crowd,
 * one player saves and reads `/api/me` in turn with nothing else running (the unloaded figures).
 * Prints acknowledged writes lost, status codes per second, the recovery time, and p50/p95 of
 * saves next to /api/me measured over the same seconds.
 * Requests go only to this machine's loopback address, are bounded in time and stop by themselves.
 */
import { spawn } from "node:child_process";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { pathToFileURL } from "node:url";
import { and, eq } from "drizzle-orm";
import { Client } from "pg";
import type { BenchSection } from "./index";
import { percentile } from "./util";
import { generatePartXml } from "./generate-part";
import { db } from "../../db/client";
import { markings } from "../../db/schema";
import { DEFAULT_MARKING } from "../../lib/markings/schema";
import { createSignedInUser, type ApiClient } from "../../tests/helpers/session";
import { multipartFile } from "../../tests/helpers/parts";

const SAVERS_PER_PLAYER = 5;
const PLAYERS = 10;
const READERS = 5;
/** Bars per part: the part row carries its text, file and analysis, so its size matters to a save. */
const MEASURES = 120;
const DURATION_MS = Number(process.env.BENCH_LOAD_MS ?? 30_000);
const OUTAGE_AT_MS = DURATION_MS / 3;
const OUTAGE_HOLD_MS = Number(process.env.BENCH_OUTAGE_MS ?? 1_000);
const UNLOADED_RUNS = 100;

interface Sample { at: number; ms: number; status: number; kind: "save" | "me" }
type Cluster = { dir: string; port: number; database: string; user: string; password: string; fast: boolean; recreateDatabase: boolean };

/**
 * Stops or starts the cluster in a child process: pg_ctl waits synchronously, and the crowd must
 * keep sending (and the bench keep timing) while the database is away.
 */
function pgInChild(op: "stop" | "start", cluster: Cluster): Promise<void> {
  const module = pathToFileURL(path.resolve("scripts/pg.mjs")).href;
  const call = op === "stop" ? "m.stopCluster(o.dir)" : "m.startCluster(o)";
  const code = `const o = JSON.parse(process.env.BENCH_CLUSTER); import(${JSON.stringify(module)}).then((m) => { ${call}; });`;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--input-type=module", "-e", code], { env: { ...process.env, BENCH_CLUSTER: JSON.stringify(cluster) }, stdio: "inherit" });
    child.on("error", reject);
    child.on("exit", (status) => (status === 0 ? resolve() : reject(new Error(`pg ${op} exited with ${status}`))));
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Resolves when the database answers a query again (polled every 50 ms). */
async function databaseAnswers(url: string): Promise<void> {
  for (;;) {
    const client = new Client({ connectionString: url, connectionTimeoutMillis: 1000 });
    client.on("error", () => {});
    try {
      await client.connect();
      await client.query("select 1");
      return;
    } catch {
      await sleep(50);
    } finally {
      await client.end().catch(() => {});
    }
  }
}
const ok = (status: number) => status >= 200 && status < 300;
const stats = (xs: number[]) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return { n: sorted.length, "p50 ms": +percentile(sorted, 50).toFixed(1), "p95 ms": +percentile(sorted, 95).toFixed(1) };
};

/** One note's saves: each names the version the last answer gave (as the workspace does). */
class Saver {
  version: number | undefined;
  depth = 0;
  constructor(readonly client: ApiClient, readonly partId: string, readonly key: string) {}

  async save(stamp: number): Promise<number> {
    this.depth = (this.depth % 100) + 1;
    const res = await this.client.fetch(`/api/parts/${this.partId}/markings/${encodeURIComponent(this.key)}`, {
      method: "PUT",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ ...DEFAULT_MARKING, depthCents: this.depth, comment: String(stamp), version: this.version }),
    });
    const body = (await res.json().catch(() => null)) as { marking?: { version: number }; current?: { version: number } | null } | null;
    if (ok(res.status)) this.version = body?.marking?.version;
    // A save whose answer was lost may have landed: the conflict names the version to go on from.
    else if (res.status === 409) this.version = body?.current?.version;
    return res.status;
  }
}

const section: BenchSection = {
  name: "load",
  async run() {
    const dbUrl = new URL(process.env.DATABASE_URL!);
    const cluster: Cluster = {
      dir: path.resolve(".data/pg-bench"), port: Number(dbUrl.port), database: dbUrl.pathname.slice(1),
      user: "ondula", password: "ondula", fast: true, recreateDatabase: false,
    };
    const xml = new TextEncoder().encode(generatePartXml({ measures: MEASURES, seed: 11 }));
    const players: Array<{ client: ApiClient; partId: string; keys: string[] }> = [];
    for (let i = 0; i < PLAYERS; i++) {
      const { client } = await createSignedInUser();
      const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile(`load-${i}.musicxml`, xml) });
      const { id } = await res.json();
      const analysis = await (await client.fetch(`/api/parts/${id}/analysis`)).json();
      players.push({ client, partId: id, keys: analysis.notes.slice(0, SAVERS_PER_PLAYER + 1).map((n: { key: string }) => n.key) });
    }
    console.log(`${PLAYERS} players × ${SAVERS_PER_PLAYER} savers on parts of ${MEASURES} bars (${(xml.byteLength / 1024).toFixed(0)} KB each), ${READERS} readers of /api/me, ${DURATION_MS / 1000} s; PostgreSQL stopped at ${OUTAGE_AT_MS / 1000} s, held down ${OUTAGE_HOLD_MS} ms, started again`);

    // Unloaded: one client, one request at a time, save and /api/me in turn.
    {
      const p = players[0];
      const lone = new Saver(p.client, p.partId, p.keys[SAVERS_PER_PLAYER]);
      const save: number[] = [];
      const me: number[] = [];
      for (let i = 0; i < UNLOADED_RUNS + 10; i++) {
        let t = performance.now();
        const status = await lone.save(i);
        if (!ok(status)) throw new Error(`unloaded save answered ${status}`);
        if (i >= 10) save.push(performance.now() - t);
        t = performance.now();
        const res = await p.client.fetch("/api/me");
        await res.arrayBuffer();
        if (i >= 10) me.push(performance.now() - t);
      }
      const s = stats(save);
      const m = stats(me);
      console.log("unloaded (one request at a time):");
      console.table([
        { measure: "GET /api/me (baseline)", ...m },
        { measure: "PUT marking", ...s },
        { measure: "save ÷ /api/me", n: 0, "p50 ms": +(s["p50 ms"] / m["p50 ms"]).toFixed(2), "p95 ms": +(s["p95 ms"] / m["p95 ms"]).toFixed(2) },
      ]);
    }

    const samples: Sample[] = [];
    const acked = new Map<string, number>(); // partId|noteKey → stamp of the last acknowledged save
    const t0 = performance.now();
    const now = () => performance.now() - t0;
    let stoppingAt = NaN;
    let stoppedAt = NaN;
    let startedAt = NaN;
    let answersAt = NaN;
    const end = DURATION_MS;
    let stamps = 0; // rising across the run; one note's saves go one after another

    async function saver(s: Saver) {
      while (now() < end) {
        const start = now();
        const stamp = ++stamps;
        let status = 0;
        try {
          status = await s.save(stamp);
        } catch {
          status = 0;
        }
        samples.push({ at: start, ms: now() - start, status, kind: "save" });
        if (ok(status)) acked.set(`${s.partId}|${s.key}`, stamp);
        else await sleep(200);
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
        if (!ok(status)) await sleep(200);
      }
    }
    const outage = (async () => {
      await sleep(OUTAGE_AT_MS);
      stoppingAt = now();
      await pgInChild("stop", cluster);
      stoppedAt = now();
      await sleep(OUTAGE_HOLD_MS);
      // The start command also checks the role and database after the server is up.
      await Promise.all([
        pgInChild("start", cluster).then(() => (startedAt = now())),
        databaseAnswers(process.env.DATABASE_URL!).then(() => (answersAt = now())),
      ]);
    })();
    await Promise.all([
      ...players.flatMap((p) => p.keys.slice(0, SAVERS_PER_PLAYER).map((k) => saver(new Saver(p.client, p.partId, k)))),
      ...players.slice(0, READERS).map((p) => reader(p.client)),
      outage,
    ]);

    // Every acknowledged save must be in the database: the stored comment is the stamp of the last
    // save that reached it, never older than the last acknowledged one.
    let lost = 0;
    for (const [k, ackedStamp] of acked) {
      const [partId, noteKey] = k.split("|");
      const [row] = await db().select({ comment: markings.comment }).from(markings).where(and(eq(markings.partId, partId), eq(markings.noteKey, noteKey)));
      if (!row || Number(row.comment) < ackedStamp) lost++;
    }

    // The outage: from the stop command until the first request that succeeded after the database
    // answered again.
    const afterUp = (s: Sample) => s.at + s.ms >= answersAt && ok(s.status);
    const firstOkAfter = samples.filter(afterUp).sort((a, b) => a.at + a.ms - (b.at + b.ms))[0];
    const firstSaveAfter = samples.filter((s) => s.kind === "save" && afterUp(s)).sort((a, b) => a.at + a.ms - (b.at + b.ms))[0];
    const outageEnd = firstOkAfter ? firstOkAfter.at + firstOkAfter.ms : Infinity;
    const inOutage = (s: Sample) => s.at + s.ms >= stoppingAt && s.at <= outageEnd;

    const perSecond = new Map<number, Record<string, number>>();
    for (const s of samples) {
      const sec = Math.floor(s.at / 1000);
      const row = perSecond.get(sec) ?? {};
      row[String(s.status)] = (row[String(s.status)] ?? 0) + 1;
      perSecond.set(sec, row);
    }
    const outageSeconds = (sec: number) => sec * 1000 < outageEnd && (sec + 1) * 1000 > stoppingAt;
    console.log("status codes per second (all requests, by when they were sent; * = the outage, stop → first success after the database answers again):");
    for (const [sec, row] of [...perSecond].sort((a, b) => a[0] - b[0])) {
      console.log(`  ${outageSeconds(sec) ? "*" : " "}${String(sec).padStart(3)} s  ${Object.entries(row).map(([k, v]) => `${k}×${v}`).join("  ")}`);
    }
    const failures = samples.filter((s) => !ok(s.status));
    const byStatus = (list: Sample[]) => {
      const m = new Map<number, number>();
      for (const s of list) m.set(s.status, (m.get(s.status) ?? 0) + 1);
      return [...m].sort((a, b) => a[0] - b[0]).map(([k, v]) => `${k}×${v}`).join(" ") || "none";
    };
    console.table([
      { measure: "acknowledged saves", value: samples.filter((s) => s.kind === "save" && ok(s.status)).length },
      { measure: "acknowledged writes lost (goal 0)", value: lost },
      { measure: "non-2xx during the outage", value: byStatus(failures.filter(inOutage)) },
      { measure: "non-2xx outside the outage (goal none)", value: byStatus(failures.filter((s) => !inOutage(s))) },
      { measure: "stop command took (ms)", value: Math.round(stoppedAt - stoppingAt) },
      { measure: "database away: stop sent → answers again (ms)", value: Math.round(answersAt - stoppingAt) },
      { measure: "start command done after it answers (ms)", value: Math.round(startedAt - answersAt) },
      { measure: "recovery: database answers → first save acknowledged (ms)", value: firstSaveAfter ? Math.round(firstSaveAfter.at + firstSaveAfter.ms - answersAt) : NaN },
      { measure: "recovery: database answers → last failure answered (ms)", value: failures.length ? Math.round(Math.max(...failures.map((s) => s.at + s.ms)) - answersAt) : 0 },
    ]);
    // Latency outside the outage (the outage's own answers are fast 503s).
    const calm = (s: Sample) => ok(s.status) && !inOutage(s);
    const saves = stats(samples.filter((s) => s.kind === "save" && calm(s)).map((s) => s.ms));
    const me = stats(samples.filter((s) => s.kind === "me" && calm(s)).map((s) => s.ms));
    console.log("under the crowd (outside the outage):");
    console.table([
      { measure: "GET /api/me (baseline)", ...me },
      { measure: "PUT marking", ...saves },
      { measure: "save ÷ /api/me (goal p95 ≤ 3)", n: 0, "p50 ms": +(saves["p50 ms"] / me["p50 ms"]).toFixed(2), "p95 ms": +(saves["p95 ms"] / me["p95 ms"]).toFixed(2) },
    ]);
  },
};

export default section;
