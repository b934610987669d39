/**
 * Two app instances sharing one database, as a school district would run one Coilyard for several schools behind
 * a load balancer: on a fresh PostgreSQL database of their own when COILYARD_TEST_POSTGRES_URL names a test server
 * (CI always does; scripts/ensure-postgres.sh), else on one fresh SQLite file (WAL mode lets two processes share it).
 * Both get the demo network (prisma/seed.ts) and one session secret, so a sign-in is good on either.
 *
 * Ports: E2E_SITES_PORTS="3250,3251" names both; otherwise E2E_PORT + 70 and + 71 (beside the Playwright web server
 * on E2E_PORT and e2e/multi-instance.spec.ts's + 60 and + 61), so checkouts side by side do not collide.
 */
import { execFileSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import path from "node:path";
import pg from "pg";
import { OwnServer, prepareDemoDatabase } from "./own-server";

export function sitePorts(env: NodeJS.ProcessEnv = process.env): [number, number] {
  const named = env.E2E_SITES_PORTS?.split(",").map((p) => Number(p.trim()));
  if (named && named.length === 2 && named.every((p) => Number.isInteger(p) && p > 0)) return named as [number, number];
  const base = Number(env.E2E_PORT ?? 3100) + 70;
  return [base, base + 1];
}

export interface SharedServers {
  servers: [OwnServer, OwnServer];
  /** "PostgreSQL" or "SQLite": which database the two instances share, for test titles and messages. */
  database: "PostgreSQL" | "SQLite";
  stop(): Promise<void>;
}

async function freshPostgresDatabase(serverUrl: string, name: string): Promise<string> {
  const admin = new pg.Client({ connectionString: serverUrl });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  const url = new URL(serverUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

/** Builds the shared database with the demo network and starts both instances on it. */
export async function startSharedServers(root: string, postgresServerUrl: string | undefined = process.env.COILYARD_TEST_POSTGRES_URL): Promise<SharedServers> {
  const [first, second] = sitePorts();
  const dir = path.join(root, `data/e2e-sites-${first}`);
  const secret = randomBytes(32).toString("base64url");
  let environment: Record<string, string>;
  if (postgresServerUrl) {
    const url = await freshPostgresDatabase(postgresServerUrl, `coilyard_e2e_sites_${first}`);
    environment = { DATABASE_URL: url, NEXTAUTH_SECRET: secret, COILYARD_DATA_DIR: dir };
    const env = { ...process.env, ...environment };
    execFileSync("npx", ["prisma", "migrate", "deploy"], { cwd: root, env, stdio: "pipe" });
    execFileSync("npx", ["tsx", "prisma/seed.ts"], { cwd: root, env, stdio: "pipe" });
  } else {
    const file = prepareDemoDatabase(dir);
    environment = { DATABASE_URL: `file:${file}`, NEXTAUTH_SECRET: secret, COILYARD_DATA_DIR: dir };
  }
  const servers: [OwnServer, OwnServer] = [new OwnServer(first, path.join(dir, `instance-${first}`), environment), new OwnServer(second, path.join(dir, `instance-${second}`), environment)];
  try {
    await Promise.all(servers.map((server) => server.start()));
  } catch (error) {
    await Promise.all(servers.map((server) => server.stop()));
    throw error;
  }
  return {
    servers,
    database: postgresServerUrl ? "PostgreSQL" : "SQLite",
    stop: async () => {
      await Promise.all(servers.map((server) => server.stop()));
    },
  };
}
