/**
 * `npm run bench`: the quick benchmarks. Opt-in: `-- --large` adds the large-fleet pages and sweep import (builds
 * a ~1 GB fixture in data/bench once, ~30 s); `-- --load` the session-logging load test (needs `npm run build`).
 */
import { benchCalc } from "./calc";

async function main(): Promise<void> {
  await benchCalc();
  if (process.argv.includes("--large")) {
    const { benchLargeFleetPages } = await import("./large-fleet-pages");
    await benchLargeFleetPages();
    const { benchSweepImport } = await import("./sweep-import-memory");
    await benchSweepImport();
  }
  if (process.argv.includes("--load")) {
    const { benchSessionLoad } = await import("./session-load");
    await benchSessionLoad();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
