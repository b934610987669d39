/**
 * Loads the demo network (the Kettlewell club on the default site, and a school) into an empty database (the quick
 * start), or wipes and reloads it with --reset. Never touches a database that already has users unless told to.
 *   npm run db:seed            # only when empty
 *   npm run db:reset-demo      # wipe and reload
 */
import { hashPassword } from "../lib/auth/password";
import { countUsersForSeed, disconnect, emptyDatabase, loadDemoDataset } from "../lib/db/demo-loader";
import { DEMO_PEOPLE, type DemoPersonKey } from "./demo/people";
import { generateDemoDataset } from "./demo/generate";

async function main() {
  const reset = process.argv.includes("--reset");
  if (!reset && (await countUsersForSeed()) > 0) {
    console.log("Demo data: the database already has users, so nothing was loaded (use npm run db:reset-demo to replace everything).");
    return;
  }
  const started = Date.now();
  const passwordHashes = Object.fromEntries(
    await Promise.all(DEMO_PEOPLE.map(async (p) => [p.key, await hashPassword(p.password)] as const)),
  ) as Record<DemoPersonKey, string>;
  const today = new Date();
  const anchor = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate()));
  const dataset = generateDemoDataset({ anchor, passwordHashes });
  if (reset) await emptyDatabase();
  await loadDemoDataset(dataset);
  console.log(
    `Demo network loaded in ${((Date.now() - started) / 1000).toFixed(1)} s: ${dataset.sites.length} sites, ${dataset.users.length} people, ${dataset.coils.length} coils, ${dataset.sessions.length} run sessions ` +
      `(${dataset.samples.length} heat-sink samples), ${dataset.sweeps.length} sweeps (${dataset.sweepPoints.length} points), ` +
      `${dataset.failures.length} failures, ${dataset.clearances.length} clearances, ${dataset.loans.length} loans.`,
  );
}

try {
  await main();
} finally {
  await disconnect();
}
