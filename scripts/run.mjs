#!/usr/bin/env node
// The two commands: `npm start` and `npm test` (plus `dev` and `bench`).
// Node built-ins only: this file runs before dependencies are installed.
import { spawn, spawnSync } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { startCluster, stopCluster, pgBinDir } from "./pg.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
process.chdir(root);

const mode = process.argv[2] ?? "start";
const args = process.argv.slice(3);
const flag = (name) => args.includes(`--${name}`);
const option = (name) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : undefined;
};

// Every port can move together (ONDULA_PORT_OFFSET), so several checkouts can run side by side.
const offset = Number(process.env.ONDULA_PORT_OFFSET ?? 0);
const PROFILES = {
  start: { app: 3000, pg: 54329, smtp: 2525, mailApi: 2526, db: "ondula", dir: ".data/pg", fast: false, appEnv: "development" },
  dev: { app: 3000, pg: 54329, smtp: 2525, mailApi: 2526, db: "ondula", dir: ".data/pg", fast: false, appEnv: "development" },
  test: { app: 3100, pg: 54339, smtp: 2535, mailApi: 2536, db: "ondula_test", dir: ".data/pg-test", fast: true, appEnv: "test" },
  bench: { app: 3200, pg: 54349, smtp: 2545, mailApi: 2546, db: "ondula_bench", dir: ".data/pg-bench", fast: true, appEnv: "test" },
};
const profile = PROFILES[mode];
if (!profile) {
  console.error(`unknown mode "${mode}" (start, dev, test, bench)`);
  process.exit(2);
}
for (const k of ["app", "pg", "smtp", "mailApi"]) profile[k] += offset;

const DEMO_PASSWORD = process.env.DEMO_PASSWORD ?? "ondula-demo-2026";
const children = [];
let cluster = null;
let stopping = false;

const log = (msg) => console.log(`\x1b[36m[ondula]\x1b[0m ${msg}`);

function run(cmd, argv, opts = {}) {
  const res = spawnSync(cmd, argv, { stdio: "inherit", env: opts.env ?? process.env, cwd: root });
  if (res.status !== 0 && !opts.allowFail) throw new Error(`${cmd} ${argv.join(" ")} exited with ${res.status}`);
  return res.status ?? 1;
}

// ---------------------------------------------------------------- installation

function ensureNodeModules() {
  const marker = path.join(root, "node_modules", ".package-lock.json");
  const lock = path.join(root, "package-lock.json");
  const fresh = fs.existsSync(marker) && fs.statSync(marker).mtimeMs >= fs.statSync(lock).mtimeMs;
  if (fresh) return;
  log("installing npm dependencies (npm ci)…");
  run("npm", ["ci", "--no-audit", "--no-fund"]);
}

function aptInstall(pkgs) {
  if (pkgs.length === 0) return;
  log(`installing Debian packages: ${pkgs.join(", ")}`);
  const isRoot = process.getuid?.() === 0;
  const prefix = isRoot ? [] : ["sudo", "-n"];
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const exec = (argv) => {
    const [cmd, ...rest] = [...prefix, ...argv];
    return spawnSync(cmd, rest, { stdio: "inherit", env }).status;
  };
  if (exec(["apt-get", "install", "-y", "--no-install-recommends", ...pkgs]) !== 0) {
    if (exec(["apt-get", "update"]) !== 0 || exec(["apt-get", "install", "-y", "--no-install-recommends", ...pkgs]) !== 0) {
      throw new Error(`could not install ${pkgs.join(", ")} with apt-get (run as root or with passwordless sudo)`);
    }
  }
}

function ensureSystemPackages({ browser }) {
  const missing = [];
  if (!pgBinDir()) missing.push("postgresql");
  if (browser && !fs.existsSync("/usr/bin/chromium")) missing.push("chromium");
  if (browser && !fs.existsSync("/usr/bin/pdftoppm")) missing.push("poppler-utils");
  aptInstall(missing);
}

// ---------------------------------------------------------------- services

function waitForPort(port, timeoutMs = 30_000) {
  const started = Date.now();
  return new Promise((resolve, reject) => {
    const attempt = () => {
      const s = net.connect(port, "127.0.0.1");
      s.once("connect", () => {
        s.destroy();
        resolve();
      });
      s.once("error", () => {
        s.destroy();
        if (Date.now() - started > timeoutMs) reject(new Error(`nothing listening on 127.0.0.1:${port} after ${timeoutMs} ms`));
        else setTimeout(attempt, 150);
      });
    };
    attempt();
  });
}

function portInUse(port) {
  return new Promise((resolve) => {
    const s = net.connect(port, "127.0.0.1");
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

function startChild(name, cmd, argv, env, { quiet = false } = {}) {
  const child = spawn(cmd, argv, { cwd: root, env, stdio: quiet ? ["ignore", "ignore", "inherit"] : "inherit" });
  children.push({ name, child });
  child.on("exit", (code, signal) => {
    if (!stopping) log(`${name} exited (${signal ?? code})`);
  });
  return child;
}

const tsx = [path.join(root, "node_modules", "tsx", "dist", "cli.mjs")];

async function startServices({ recreateDatabase }) {
  log(`PostgreSQL on 127.0.0.1:${profile.pg} (${profile.dir})`);
  cluster = startCluster({
    dir: path.join(root, profile.dir),
    port: profile.pg,
    database: profile.db,
    user: "ondula",
    password: "ondula",
    fast: profile.fast,
    recreateDatabase,
  });
  if (await portInUse(profile.smtp)) throw new Error(`port ${profile.smtp} (SMTP) is taken; set ONDULA_PORT_OFFSET to move every port`);
  startChild("mail server", process.execPath, [...tsx, "scripts/mail-server.ts"], {
    ...process.env,
    SMTP_PORT: String(profile.smtp),
    MAIL_API_PORT: String(profile.mailApi),
    APP_ENV: profile.appEnv,
  });
  await waitForPort(profile.smtp);
  await waitForPort(profile.mailApi);
  const appUrl = `http://127.0.0.1:${profile.app}`;
  const env = {
    ...process.env,
    APP_ENV: profile.appEnv,
    DATABASE_URL: cluster.url,
    SMTP_URL: `smtp://127.0.0.1:${profile.smtp}`,
    MAIL_API_URL: `http://127.0.0.1:${profile.mailApi}`,
    APP_URL: appUrl,
    NEXTAUTH_URL: appUrl,
    AUTH_SECRET: process.env.AUTH_SECRET ?? `local-${profile.appEnv}-secret-not-for-production-0123456789`,
    DEMO_PASSWORD,
    SEED_DEMO: "yes",
    PORT: String(profile.app),
    // Tests and benches stand in for many clients by sending X-Forwarded-For, as one proxy would.
    TRUSTED_PROXIES: process.env.TRUSTED_PROXIES ?? (mode === "test" || mode === "bench" ? "1" : "0"),
    NEXT_TELEMETRY_DISABLED: "1",
  };
  env.NEXTAUTH_SECRET = env.AUTH_SECRET;
  log("migrating…");
  run(process.execPath, [...tsx, "db/migrate.ts"], { env });
  log("seeding the demo…");
  // The seed uses the server's data layer, whose modules are marked server-only.
  run(process.execPath, [...tsx, "db/seed.ts"], { env: { ...env, NODE_OPTIONS: `${env.NODE_OPTIONS ?? ""} --conditions=react-server`.trim() } });
  return env;
}

// ---------------------------------------------------------------- build

const BUILD_INPUTS = ["app", "components", "lib", "db", "server", "instrumentation.ts", "proxy.ts", "public", "worker", "next.config.mjs", "tailwind.config.ts", "postcss.config.mjs", "tsconfig.json", "package-lock.json"];

function hashTree() {
  const h = crypto.createHash("sha256");
  const walk = (p) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) {
      for (const name of fs.readdirSync(p).sort()) {
        if (name === "node_modules" || name.startsWith(".")) continue;
        walk(path.join(p, name));
      }
    } else if (!/\.(test|e2e)\.tsx?$/.test(p)) {
      h.update(p);
      h.update(fs.readFileSync(p));
    }
  };
  for (const input of BUILD_INPUTS) walk(input);
  return h.digest("hex");
}

function buildIfStale(env) {
  const stamp = path.join(root, ".next", "ondula-build-hash");
  const hash = hashTree();
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, "utf8") === hash && fs.existsSync(path.join(root, ".next", "BUILD_ID"))) {
    log("build is current");
    return;
  }
  log("building (next build)…");
  run(process.execPath, [path.join(root, "node_modules", "next", "dist", "bin", "next"), "build"], {
    env: { ...env, NODE_ENV: "production" },
  });
  fs.writeFileSync(stamp, hash);
}

async function startApp(env) {
  if (await portInUse(profile.app)) throw new Error(`port ${profile.app} is taken; stop what uses it or set ONDULA_PORT_OFFSET`);
  startChild("web server", process.execPath, [path.join(root, "node_modules", "next", "dist", "bin", "next"), "start", "-H", "127.0.0.1", "-p", String(profile.app)], { ...env, NODE_ENV: "production" }, { quiet: mode === "test" || mode === "bench" });
  await waitForPort(profile.app, 60_000);
}

// ---------------------------------------------------------------- shutdown

async function stopAll() {
  if (stopping) return;
  stopping = true;
  for (const { child } of children.reverse()) {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill("SIGTERM");
      await new Promise((r) => {
        const t = setTimeout(() => {
          child.kill("SIGKILL");
          r();
        }, 5000);
        child.once("exit", () => {
          clearTimeout(t);
          r();
        });
      });
    }
  }
  if (cluster) stopCluster(path.join(root, profile.dir));
}

for (const sig of ["SIGINT", "SIGTERM"]) {
  process.on(sig, async () => {
    log("stopping…");
    await stopAll();
    process.exit(130);
  });
}

// ---------------------------------------------------------------- test suites

/** Runs a Vitest project with the JSON reporter and returns its counts. */
function vitestSuite(project, env, extraArgs = []) {
  const out = path.join(root, "test-results", `${project}.json`);
  fs.mkdirSync(path.dirname(out), { recursive: true });
  fs.rmSync(out, { force: true });
  const status = run(
    process.execPath,
    [path.join(root, "node_modules", "vitest", "vitest.mjs"), "run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${out}`, ...extraArgs],
    { env, allowFail: true },
  );
  if (!fs.existsSync(out)) return { name: project, passed: 0, failed: 1, note: `vitest exited ${status} without a report` };
  const report = JSON.parse(fs.readFileSync(out, "utf8"));
  // A file that fails to load has no test results but counts as a failure.
  const brokenFiles = report.testResults.filter((f) => f.status === "failed" && f.assertionResults.length === 0).length;
  return { name: project, passed: report.numPassedTests, failed: report.numFailedTests + brokenFiles + (status !== 0 && report.numFailedTests === 0 && brokenFiles === 0 ? 1 : 0) };
}

function checkSuite(name, cmd, argv, env) {
  log(`${name}…`);
  const status = run(cmd, argv, { env, allowFail: true });
  return { name, passed: status === 0 ? 1 : 0, failed: status === 0 ? 0 : 1 };
}

async function testMode() {
  const only = option("only"); // e.g. --only unit
  const filter = option("filter");
  const wants = (s) => !only || only.split(",").includes(s);
  ensureNodeModules();
  ensureSystemPackages({ browser: wants("e2e") });
  const results = [];
  const env = await startServices({ recreateDatabase: !flag("keep-db") });
  // --filter a,b: each name is a separate Vitest file filter.
  const vitestArgs = filter ? filter.split(",").filter(Boolean) : [];
  const bin = (p) => path.join(root, "node_modules", ...p.split("/"));
  if (wants("typecheck")) results.push(checkSuite("typecheck", process.execPath, [bin("typescript/bin/tsc"), "--noEmit", "-p", "tsconfig.json"], env));
  if (wants("lint")) results.push(checkSuite("lint", process.execPath, [bin("eslint/bin/eslint.js"), ".", "--max-warnings=0"], env));
  if (wants("unit")) results.push(vitestSuite("unit", env, vitestArgs));
  if (wants("components")) results.push(vitestSuite("components", env, vitestArgs));
  if (wants("integration") || wants("e2e")) {
    buildIfStale(env);
    await startApp(env);
    if (wants("integration")) results.push(vitestSuite("integration", env, vitestArgs));
    if (wants("e2e")) results.push(vitestSuite("e2e", env, vitestArgs));
  }
  await stopAll();
  console.log("");
  for (const r of results) console.log(`  ${r.name.padEnd(12)} ${r.passed} passed, ${r.failed} failed${r.note ? ` (${r.note})` : ""}`);
  const passed = results.reduce((a, r) => a + r.passed, 0);
  const failed = results.reduce((a, r) => a + r.failed, 0);
  console.log(`${passed} passed, ${failed} failed`);
  process.exit(failed > 0 || passed === 0 ? 1 : 0);
}

async function startMode() {
  ensureNodeModules();
  ensureSystemPackages({ browser: false });
  const env = await startServices({ recreateDatabase: false });
  if (mode === "dev") {
    startChild("dev server", process.execPath, [path.join(root, "node_modules", "next", "dist", "bin", "next"), "dev", "-H", "127.0.0.1", "-p", String(profile.app)], env);
    await waitForPort(profile.app, 120_000);
  } else {
    buildIfStale(env);
    await startApp(env);
  }
  console.log(`
  Ondula is running at ${env.APP_URL}
  Local mailbox:       ${env.APP_URL}/dev/mail
  Demo accounts (password "${DEMO_PASSWORD}"):
    player@demo.ondula.test    (player, in the teacher's studio)
    teacher@demo.ondula.test   (teacher)
    admin@demo.ondula.test     (admin)
  Press Ctrl-C to stop everything.
`);
  await new Promise(() => {});
}

async function benchMode() {
  ensureNodeModules();
  ensureSystemPackages({ browser: true });
  const env = await startServices({ recreateDatabase: true });
  buildIfStale(env);
  await startApp(env);
  const status = run(process.execPath, [...tsx, "scripts/bench/index.ts", ...args], { env, allowFail: true });
  await stopAll();
  process.exit(status);
}

const main = mode === "test" ? testMode : mode === "bench" ? benchMode : startMode;
main().catch(async (err) => {
  console.error(`\n[ondula] ${err instanceof Error ? err.message : String(err)}`);
  await stopAll();
  process.exit(1);
});
