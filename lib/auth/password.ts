/**
 * Password hashing with bcryptjs (a well-kept, pure-JS bcrypt: no native build step on install).
 * Cost 12 is the common-practice balance between guessing cost and sign-in latency on a small server.
 */
import bcrypt from "bcryptjs";

const BCRYPT_COST = 12;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/**
 * A hash of a random string, compared against when the e-mail is unknown, so an unknown account
 * takes as long to refuse as a wrong password (no account enumeration by timing).
 */
export const DUMMY_HASH = bcrypt.hashSync("coilyard-no-such-user", BCRYPT_COST);
