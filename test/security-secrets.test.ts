/**
 * No secret in the repository: every tracked file (git ls-files) is scanned for things that look like
 * secrets. The demo club's passwords (README, prisma/demo, e2e accounts, quick start) are demo data,
 * allowed by exact value below; test passwords in test files are throwaway values for a test database.
 */
import { execFileSync } from "node:child_process";
import { readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = path.resolve(__dirname, "..");
const tracked = execFileSync("git", ["ls-files", "-z"], { cwd: ROOT, encoding: "utf8" }).split("\0").filter(Boolean);

/** Demo data, published on purpose so anyone can try the demo club. */
const DEMO_PASSWORDS = [
  "demo-admin-pass",
  "demo-steward-pass",
  "demo-member-pass",
  "demo-member-pass-2",
  "demo-member-pass-3",
  "demo-school-steward-pass",
  "demo-school-member-pass",
  "demo-organisation-pass",
];

const SECRET_PATTERNS: { name: string; pattern: RegExp }[] = [
  { name: "a private key", pattern: /-----BEGIN [A-Z ]*PRIVATE KEY-----/ },
  // An assignment of a literal value (not a variable read) to a secret-looking name, e.g. NEXTAUTH_SECRET=abc… in a file.
  { name: "a NEXTAUTH_SECRET value", pattern: /NEXTAUTH_SECRET\s*[=:]\s*["']?[A-Za-z0-9+/_=-]{16,}/ },
  { name: "an AWS access key", pattern: /\bAKIA[0-9A-Z]{16}\b/ },
  { name: "a GitHub token", pattern: /\bgh[pousr]_[A-Za-z0-9]{36,}\b/ },
  { name: "an npm token", pattern: /\bnpm_[A-Za-z0-9]{36}\b/ },
  { name: "a Slack token", pattern: /\bxox[abpr]-[A-Za-z0-9-]{10,}/ },
  { name: "a bcrypt hash", pattern: /\$2[aby]\$\d\d\$[./A-Za-z0-9]{53}/ },
  { name: "a password in a URL", pattern: /\b[a-z][a-z0-9+.-]*:\/\/[^/\s:@'"`]+:[^/\s:@'"`$]{3,}@/i },
];

const TEXT_LIMIT = 2_000_000;

function readText(file: string): string | null {
  const full = path.join(ROOT, file);
  const stat = statSync(full, { throwIfNoEntry: false });
  if (!stat?.isFile() || stat.size > TEXT_LIMIT) return null;
  const buffer = readFileSync(full);
  return buffer.includes(0) ? null : buffer.toString("utf8");
}

describe("no secret is committed", () => {
  it("tracks no .env file, key file or database", () => {
    const forbidden = tracked.filter((file) => {
      const name = path.basename(file);
      return (/^\.env(\..+)?$/.test(name) && !/\.(example|sample|template)$/.test(name)) || /\.(pem|key|p12|pfx|db|sqlite|db-wal)$/.test(name) || /^id_(rsa|ed25519|ecdsa)/.test(name) || name === ".session-secret";
    });
    expect(forbidden).toEqual([]);
  });

  it("holds nothing that looks like a secret in any tracked text file", () => {
    const findings: string[] = [];
    for (const file of tracked) {
      if (file === "test/security-secrets.test.ts") continue; // its own patterns
      const text = readText(file);
      if (text === null) continue;
      for (const { name, pattern } of SECRET_PATTERNS) {
        const match = pattern.exec(text);
        if (match) findings.push(`${file}: ${name} (${match[0].slice(0, 24)}…)`);
      }
    }
    expect(findings).toEqual([]);
  });

  it("mentions passwords only as the allowed demo values, outside tests", () => {
    const findings: string[] = [];
    for (const file of tracked.filter((f) => !/^(test|e2e)\/|\.test\.ts$/.test(f))) {
      const text = readText(file);
      if (text === null) continue;
      for (const match of text.matchAll(/password\s*[:=]\s*["'`]([^"'`\s]{6,})["'`]/gi)) {
        if (!DEMO_PASSWORDS.includes(match[1]!)) findings.push(`${file}: password "${match[1]}"`);
      }
    }
    expect(findings).toEqual([]);
  });

  it("the scan would notice a secret (the patterns are live)", () => {
    const fake = ["-----BEGIN RSA PRIVATE" + " KEY-----", "NEXTAUTH_SECRET=" + "x".repeat(40), "AKIA" + "ABCDEFGHIJKLMNOP", "postgres://coil:" + "hunter22@db/logbook"];
    for (const sample of fake) expect(SECRET_PATTERNS.some(({ pattern }) => pattern.test(sample)), sample).toBe(true);
  });
});
