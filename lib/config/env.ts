/**
 * The app's environment, validated once with zod. Every variable has a default that works out of
 * the box on the embedded SQLite database, so a fresh clone needs no .env file.
 */
import { z } from "zod";
import { databaseProvider, databaseUrl } from "./database-url";
import { loadOrCreateSessionSecret } from "./session-secret";

const envSchema = z.object({
  DATABASE_URL: z.string().min(1),
  NEXTAUTH_SECRET: z.string().min(32, "NEXTAUTH_SECRET must be at least 32 characters"),
  NEXTAUTH_URL: z.url().optional(),
  COILYARD_DATA_DIR: z.string().min(1),
  /** Minutes a sign-in key stays locked after too many failures. */
  COILYARD_SIGNIN_LOCK_MINUTES: z.coerce.number().int().positive().default(15),
});

export type AppEnv = z.infer<typeof envSchema>;

let cached: AppEnv | undefined;

export function appEnv(): AppEnv {
  if (cached) return cached;
  const dataDir = process.env.COILYARD_DATA_DIR?.trim() || "data";
  // On PostgreSQL several instances may share the database, and a session signed by one must be accepted by the
  // others: a secret generated per instance in its data folder would sign people out whenever the balancer
  // switched instance. So the secret is required, and must be the same on every instance.
  if (databaseProvider(databaseUrl()) === "postgresql" && !process.env.NEXTAUTH_SECRET?.trim()) {
    throw new Error("Coilyard's configuration is invalid:\n  NEXTAUTH_SECRET: required with a PostgreSQL DATABASE_URL (set the same value on every app instance)");
  }
  const parsed = envSchema.safeParse({
    ...process.env,
    DATABASE_URL: databaseUrl(),
    COILYARD_DATA_DIR: dataDir,
    NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET?.trim() || loadOrCreateSessionSecret(dataDir),
    NEXTAUTH_URL: process.env.NEXTAUTH_URL?.trim() || undefined,
  });
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join(".")}: ${issue.message}`);
    throw new Error(`Coilyard's configuration is invalid:\n${lines.join("\n")}`);
  }
  // next-auth reads these from process.env at request time.
  process.env.NEXTAUTH_SECRET = parsed.data.NEXTAUTH_SECRET;
  // Without a fixed public URL, trust the Host header so members on the lab's network (phones
  // included) are redirected back to the address they used, not to localhost.
  if (!parsed.data.NEXTAUTH_URL && !process.env.AUTH_TRUST_HOST) process.env.AUTH_TRUST_HOST = "true";
  cached = parsed.data;
  return cached;
}
