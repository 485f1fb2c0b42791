// Lists the imports that run against the house's direction:
//   app → components → lib (client) and app → server → db → lib.
// Usage: node scripts/import-direction.mjs [--list]
// Lint enforces the same rules (eslint.config.mjs); this prints a count for reviews.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

const root = path.resolve(import.meta.dirname, "..");
const roots = ["app", "components", "lib", "server", "db"];
// Feature folders of components/ import the shared pieces (ui, the client layer) but not each
// other; screens put features together; the shared pieces import no feature and no screen.
const features = new Set(["score", "sharing", "library", "practice", "assignments", "stand-copy", "auth"]);
const shared = new Set(["ui", "client"]);

function* files(dir) {
  let entries;
  try {
    entries = readdirSync(path.join(root, dir));
  } catch {
    return;
  }
  for (const name of entries) {
    const rel = path.join(dir, name);
    if (name === "migrations" || name === "node_modules") continue;
    if (statSync(path.join(root, rel)).isDirectory()) yield* files(rel);
    else if (/\.(ts|tsx|mjs)$/.test(name)) yield rel;
  }
}

/** The layer a repository path belongs to (an older `lib/server` counts as the server layer). */
function layer(rel) {
  const parts = rel.split(path.sep);
  if (parts[0] === "lib" && parts[1] === "server") return { top: "server" };
  if (parts[0] === "components") return { top: "components", feature: parts.length > 2 ? parts[1] : null };
  return { top: parts[0] };
}

const allowed = {
  app: new Set(["app", "components", "lib", "server"]),
  components: new Set(["components", "lib"]),
  server: new Set(["server", "db", "lib"]),
  db: new Set(["db", "lib"]),
  lib: new Set(["lib"]),
};

function againstComponents(from, to) {
  if (features.has(from)) return features.has(to) || to === "screens";
  if (shared.has(from)) return features.has(to) || to === "screens";
  return false;
}

function target(from, spec) {
  if (spec.startsWith("@/")) return spec.slice(2);
  if (spec.startsWith(".")) return path.relative(root, path.resolve(root, path.dirname(from), spec));
  return null;
}

const against = [];
for (const top of roots) {
  for (const file of files(top)) {
    if (/\.test\.tsx?$/.test(file)) continue;
    const text = readFileSync(path.join(root, file), "utf8");
    const specs = [...text.matchAll(/(?:from\s+|import\s*\(\s*|^import\s+)["']([^"']+)["']/gm)].map((m) => m[1]);
    for (const spec of specs) {
      const to = target(file, spec);
      if (!to || !roots.includes(to.split(path.sep)[0])) continue;
      const a = layer(file);
      const b = layer(to);
      let why = null;
      if (!allowed[a.top]?.has(b.top)) why = `${a.top} → ${b.top}`;
      else if (a.top === "components" && b.top === "components" && a.feature !== b.feature && againstComponents(a.feature, b.feature))
        why = `components/${a.feature ?? "(top)"} → components/${b.feature ?? "(top)"}`;
      if (why) against.push({ file, spec, why });
    }
  }
}

const byKind = new Map();
for (const a of against) byKind.set(a.why, (byKind.get(a.why) ?? 0) + 1);
if (process.argv.includes("--list")) for (const a of against) console.log(`${a.why}\t${a.file}\t${a.spec}`);
for (const [kind, n] of [...byKind].sort()) console.log(`${String(n).padStart(4)}  ${kind}`);
console.log(`${against.length} imports against the direction`);
