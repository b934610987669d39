/**
 * `npm run bench`: the quick benchmarks, then the table of issue 13's figures (bench/figures.ts) with whatever the
 * chosen sections measured. Opt-in sections:
 *   `-- --write`  the session write against raw better-sqlite3 (a fresh small database, seconds);
 *   `-- --large`  the large-fleet pages, sweep import and export memory (builds a ~1 GB fixture in data/bench once, ~30 s);
 *   `-- --load`   session logging and pages under load against a trivial route (needs `npm run build` first);
 *   `-- --prisma-lines` with PRISMA7_DIR: Prisma 6.19 against a newer line on the same workload (DEVELOPERS.md);
 *   `-- --all`    --write, --large and --load.
 */
import { fileURLToPath } from "node:url";
import { benchCalc } from "./calc";
import { printFigureTable, runSectionInChild } from "./figures";

const all = process.argv.includes("--all");
const wants = (flag: string) => all || process.argv.includes(flag);

async function main(): Promise<void> {
  await benchCalc();
  // Each section that opens lib/db on a database of its own runs in a child process (lib/db's client is made once per
  // process); the large-fleet ones share one database and run here.
  if (wants("--write")) await runSectionInChild(fileURLToPath(new URL("./session-write.ts", import.meta.url)));
  if (wants("--large")) {
    const { benchLargeFleetPages, BUSY_TAG } = await import("./large-fleet-pages");
    await benchLargeFleetPages();
    const { benchSweepImport } = await import("./sweep-import-memory");
    await benchSweepImport();
    const { benchExportMemory } = await import("./export-memory");
    await benchExportMemory(BUSY_TAG);
  }
  if (wants("--load")) {
    const { benchSessionLoad } = await import("./session-load");
    await benchSessionLoad();
  }
  if (process.argv.includes("--prisma-lines")) await runSectionInChild(fileURLToPath(new URL("./prisma-lines.ts", import.meta.url)));
  printFigureTable();
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
