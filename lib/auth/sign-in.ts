/** Checking a sign-in attempt: throttle, then password, then account state (active, and in at least one site). */
import { findUserForSignIn, markSignedIn } from "../db/users";
import { clearThrottle, getThrottle, recordThrottleFailure } from "../db/sign-in-throttle";
import { activeFailures, delayBeforeAttemptMs, isLocked, recordFailure } from "./throttle-policy";
import { DUMMY_HASH, verifyPassword } from "./password";

export type SignInOutcome =
  | { ok: true; user: { id: string; email: string; name: string } }
  | { ok: false; message: string };

const WRONG = "That e-mail address and password do not match an active account.";
const NO_SITE = "Your account does not belong to any site yet. Ask an admin to add you to one.";

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

export async function attemptSignIn(
  email: string,
  password: string,
  lockMinutes: number,
  options: { wait?: (ms: number) => Promise<void> } = {},
): Promise<SignInOutcome> {
  const key = `email:${email.trim().toLowerCase()}`;
  const now = new Date();
  const throttle = await getThrottle(key);
  if (isLocked(throttle, now)) {
    const minutes = Math.ceil((throttle!.lockedUntil!.getTime() - now.getTime()) / 60_000);
    return { ok: false, message: `Too many failed sign-ins for this account. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.` };
  }
  const delay = delayBeforeAttemptMs(activeFailures(throttle, now));
  if (delay > 0) await (options.wait ?? sleep)(delay);

  const user = await findUserForSignIn(email);
  const passwordOk = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !passwordOk || !user.active) {
    // Counted against the stored state as it is now, not as read before the delay: parallel guesses all count.
    await recordThrottleFailure(key, (current) => recordFailure(current, new Date(), lockMinutes));
    return { ok: false, message: WRONG };
  }
  await clearThrottle(key);
  // Roles are per site: an account in no site (and not an organisation admin) could reach no page.
  if (!user.organisationAdmin && user.memberships.length === 0) return { ok: false, message: NO_SITE };
  await markSignedIn(user.id);
  return { ok: true, user: { id: user.id, email: user.email, name: user.name } };
}
