/**
 * `npm run bench`: each section prints its measurements next to a baseline measured in the same
 * run, as ratios. Run through scripts/run.mjs, which starts the database, mail server and app.
 * Usage: npm run bench [-- --only reader,analysis]
 */
export interface BenchSection {
  name: string;
  run: () => Promise<void>;
}

const sections: Array<() => Promise<{ default: BenchSection }>> = [
  // Each area adds its section here.
  () => import("./reader"),
  () => import("./analysis"),
  () => import("./library"),
  () => import("./workspace"),
  () => import("./stand"),
  () => import("./load"),
];

async function main() {
  const i = process.argv.indexOf("--only");
  const only = i >= 0 ? process.argv[i + 1]?.split(",") : undefined;
  for (const load of sections) {
    const { default: section } = await load();
    if (only && !only.includes(section.name)) continue;
    console.log(`\n## ${section.name}`);
    await section.run();
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : String(err));
  process.exit(1);
});
