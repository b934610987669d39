/**
 * Run by `npm run setup` after the migrations: stores the warm-up fit of every session logged before fits were kept
 * with the session (lib/db/session-fits.ts), at every site. Safe to run again: it touches only sessions without a
 * stored fit.
 */
import { backfillSessionFitsEverySite } from "../lib/db/session-fits";

backfillSessionFitsEverySite().then(
  (fitted) => {
    const count = [...fitted.values()].reduce((sum, n) => sum + n, 0);
    console.log(`backfill-session-fits: ${count} session${count === 1 ? "" : "s"} fitted across ${fitted.size} site${fitted.size === 1 ? "" : "s"}`);
    process.exit(0);
  },
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
