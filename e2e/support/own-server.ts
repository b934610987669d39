/**
 * A Coilyard server of a spec's own, for the reliability specs that kill, stop and restart it: its own port,
 * its own SQLite file (a copy of a freshly migrated and seeded demo database, scripts/e2e-db.sh), started as
 * the leader of a new process group so one signal reaches next and every worker it forks. `environment`
 * overrides the defaults, e.g. DATABASE_URL for instances sharing a PostgreSQL database.
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { copyFileSync, mkdirSync, openSync, closeSync, rmSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const NEXT_BIN = path.join(ROOT, "node_modules/next/dist/bin/next");

/** Builds the demo database once into `dir`/e2e.db (migrations, WAL mode, seed). */
export function prepareDemoDatabase(dir: string): string {
  execFileSync("bash", [path.join(ROOT, "scripts/e2e-db.sh"), dir], { cwd: ROOT, stdio: "ignore" });
  return path.join(dir, "e2e.db");
}

export class OwnServer {
  private child: ChildProcess | null = null;
  readonly dbFile: string;
  readonly baseURL: string;

  constructor(
    readonly port: number,
    readonly dir: string,
    private readonly environment: Record<string, string> = {},
  ) {
    this.dbFile = path.join(dir, "e2e.db");
    this.baseURL = `http://localhost:${port}`;
  }

  /** Replaces this server's database with a copy of `template` (a closed, checkpointed SQLite file). */
  useCopyOf(template: string): void {
    mkdirSync(this.dir, { recursive: true });
    for (const suffix of ["", "-wal", "-shm"]) rmSync(this.dbFile + suffix, { force: true });
    copyFileSync(template, this.dbFile);
  }

  get env(): NodeJS.ProcessEnv {
    return { ...process.env, DATABASE_URL: `file:${this.dbFile}`, COILYARD_DATA_DIR: this.dir, NEXTAUTH_URL: this.baseURL, NEXT_TELEMETRY_DISABLED: "1", PORT: String(this.port), ...this.environment };
  }

  get pid(): number | undefined {
    return this.child?.pid;
  }

  async start(): Promise<void> {
    if (this.child) throw new Error(`The server on ${this.port} is already running`);
    mkdirSync(this.dir, { recursive: true });
    const log = openSync(path.join(this.dir, "server.log"), "a");
    // detached: the child leads its own process group, so kill(-pid) reaches next's workers too.
    this.child = spawn(process.execPath, [NEXT_BIN, "start", "-p", String(this.port)], { cwd: ROOT, env: this.env, detached: true, stdio: ["ignore", log, log] });
    closeSync(log);
    // Detached children outlive their parent: if the test worker exits without afterAll, take the group along.
    const pgid = this.child.pid!;
    process.once("exit", () => {
      try {
        process.kill(-pgid, "SIGKILL");
      } catch {
        // already gone
      }
    });
    const deadline = Date.now() + 60_000;
    while (Date.now() < deadline) {
      if (this.child.exitCode !== null) throw new Error(`next start on ${this.port} exited with ${this.child.exitCode}; see ${this.dir}/server.log`);
      try {
        if ((await fetch(`${this.baseURL}/sign-in`)).ok) return;
      } catch {
        // not listening yet
      }
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    throw new Error(`next start did not answer on ${this.port} within 60 s (was \`npx next build\` run?)`);
  }

  /** Sends `signal` to the whole process group and waits until every process in it is gone. */
  async kill(signal: NodeJS.Signals = "SIGKILL"): Promise<void> {
    const child = this.child;
    if (!child?.pid) return;
    this.child = null;
    try {
      process.kill(-child.pid, signal);
    } catch {
      return; // already gone
    }
    const deadline = Date.now() + 15_000;
    while (groupAlive(child.pid)) {
      if (Date.now() > deadline) {
        process.kill(-child.pid, "SIGKILL");
        break;
      }
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
  }

  /** A clean stop (SIGTERM, then SIGKILL if it lingers). */
  stop(): Promise<void> {
    return this.kill("SIGTERM");
  }
}

function groupAlive(pgid: number): boolean {
  try {
    process.kill(-pgid, 0);
    return true;
  } catch {
    return false;
  }
}
