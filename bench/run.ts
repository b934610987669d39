/** `npm run bench`: every benchmark, one after another. `npm run bench -- --large` adds the large-fleet ones (builds a ~1 GB fixture once, ~30 s). */
import { benchCalc } from "./calc";

async function main(): Promise<void> {
  await benchCalc();
  if (process.argv.includes("--large")) {
    const { benchLargeFleetPages } = await import("./large-fleet-pages");
    await benchLargeFleetPages();
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
