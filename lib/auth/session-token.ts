/**
 * The session cookie read the way next-auth v4 reads it, without running its whole handler. next-auth's
 * getServerSession builds a request, runs the session route, decodes the JWT, calls the callbacks and encodes the
 * token again (a rolling expiry a server component cannot even set); all a page needs is the user id inside the
 * token, and decoding it is the whole of the check: `decode` (next-auth/jwt) decrypts with the session secret and
 * refuses an expired token (jose checks `exp`, with next-auth's 15 s clock tolerance), a forged or
 * wrong-secret one fails to decrypt. Who the user is and whether they are still active and a member is read from
 * the database afterwards (lib/auth/session.ts), so this adds no trust to the token.
 *
 * The decode is next-auth's own (next-auth/jwt `decode`: HKDF-SHA256 of the secret with its info string, 32 bytes,
 * then jose's `jwtDecrypt` of the A256GCM token with a 15 s clock tolerance), with one change: the derived key is
 * worked out once per secret and kept, where next-auth derives it again on every call (the proxy and the page each
 * decode, so that was two HKDF runs a request, ~5 % of a page's server time). test/session-token.test.ts checks
 * this decode against next-auth's on tokens next-auth encoded, expired, forged and from another secret.
 *
 * The cookie name follows next-auth's own rule (getToken's: the `__Secure-` name when NEXTAUTH_URL is https) and
 * proxy.ts uses the same function, so the proxy and the pages always look at the same cookie. A cookie too big for
 * one header is split by next-auth into `name.0`, `name.1`…; they are joined in that order, as next-auth does.
 */
import { hkdfSync } from "node:crypto";
import { jwtDecrypt } from "jose";
import { countAuthStep } from "./auth-counters";

const SESSION_COOKIE = "next-auth.session-token";

/** Whether next-auth sets its session cookie with the `__Secure-` prefix: when the app's URL is https. */
export function usesSecureSessionCookie(nextAuthUrl: string | undefined = process.env.NEXTAUTH_URL): boolean {
  return nextAuthUrl?.startsWith("https://") ?? false;
}

export function sessionCookieName(secure: boolean = usesSecureSessionCookie()): string {
  return secure ? `__Secure-${SESSION_COOKIE}` : SESSION_COOKIE;
}

interface CookieLike {
  name: string;
  value: string;
}

/** The session token from the request's cookies, its chunks joined in order; null when there is none. */
export function sessionTokenFrom(cookies: readonly CookieLike[], cookieName: string = sessionCookieName()): string | null {
  const chunkIndex = (name: string): number | null => {
    if (name === cookieName) return 0;
    const suffix = name.startsWith(`${cookieName}.`) ? name.slice(cookieName.length + 1) : "";
    return /^\d+$/.test(suffix) ? Number(suffix) : null;
  };
  const parts = cookies
    .filter((cookie) => cookie.value && chunkIndex(cookie.name) !== null)
    .sort((a, b) => chunkIndex(a.name)! - chunkIndex(b.name)!);
  return parts.length === 0 ? null : parts.map((cookie) => cookie.value).join("");
}

/** next-auth v4's (next-auth/jwt: decode's `clockTolerance`). */
const NEXT_AUTH_CLOCK_TOLERANCE_S = 15;
/** next-auth v4's key derivation (next-auth/jwt getDerivedEncryptionKey, with its default empty salt). */
const NEXT_AUTH_KEY_INFO = "NextAuth.js Generated Encryption Key";

const keysBySecret = new Map<string, Uint8Array>();

/** The session token's encryption key for `secret`, derived once. */
function sessionKey(secret: string): Uint8Array {
  let key = keysBySecret.get(secret);
  if (!key) {
    key = new Uint8Array(hkdfSync("sha256", secret, "", NEXT_AUTH_KEY_INFO, 32));
    keysBySecret.set(secret, key);
  }
  return key;
}

/** The signed-in user's id from a session token, or null when it is missing, expired, forged or carries no user. */
export async function decodeSessionUserId(token: string | null, secret: string): Promise<string | null> {
  if (!token) return null;
  countAuthStep("tokenDecodes");
  try {
    const { payload } = await jwtDecrypt(token, sessionKey(secret), { clockTolerance: NEXT_AUTH_CLOCK_TOLERANCE_S });
    return typeof payload.sub === "string" && payload.sub ? payload.sub : null;
  } catch {
    return null;
  }
}
