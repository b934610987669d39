/**
 * A per-installation session secret, generated on first start when NEXTAUTH_SECRET is not set and
 * kept beside the database so sessions survive restarts. Never a hard-coded value.
 */
import { randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

export function loadOrCreateSessionSecret(dataDir: string): string {
  const file = path.resolve(/* turbopackIgnore: true */ dataDir, ".session-secret");
  if (existsSync(file)) {
    const stored = readFileSync(file, "utf8").trim();
    if (stored.length >= 32) return stored;
  }
  mkdirSync(path.dirname(file), { recursive: true });
  const secret = randomBytes(48).toString("base64url");
  // "wx" fails if another process created the file first; then read theirs.
  try {
    writeFileSync(file, secret + "\n", { flag: "wx", mode: 0o600 });
    chmodSync(file, 0o600);
    return secret;
  } catch {
    return readFileSync(file, "utf8").trim();
  }
}
