/**
 * Run by `npm run setup` after the migrations: stores the warm-up fit of every session logged before fits were kept
 * with the session (lib/db/session-fits.ts). Safe to run again: it touches only sessions without a stored fit.
 */
import { backfillSessionFits } from "../lib/db/session-fits";

backfillSessionFits().then(
  (count) => {
    console.log(`backfill-session-fits: ${count} session${count === 1 ? "" : "s"} fitted`);
    process.exit(0);
  },
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
