/**
 * The app's session write as the benchmark calls it. Imported only after DATABASE_URL names the section's database
 * (lib/db opens its client on import).
 */
import { createSession } from "../lib/db/sessions";
import { benchScope } from "./bench-scope";
import type { SessionInput } from "../lib/validation/session";


/** lib/db/sessions.ts createSession, as the log form's action and POST /api/sessions call it. */
export function logSessionThroughApp(actorId: string, input: SessionInput) {
  return createSession(benchScope(actorId), input);
}
