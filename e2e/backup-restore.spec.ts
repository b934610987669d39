/**
 * Backup while running, and restore, end to end: `npm run db:backup` runs while the app takes a stream of
 * session writes; the copy passes its integrity check, holds every session acknowledged before the backup
 * began, and every session in it is whole. `npm run db:restore` refuses while the app has the file open; after
 * the app is stopped it puts the backup in place, and the restarted app serves the data as it was.
 * Runs its own `next start` (port E2E_BACKUP_PORT, default E2E_PORT + 2) on its own copy of the demo database.
 */
import { expect, test } from "@playwright/test";
import Database from "better-sqlite3";
import { execFile } from "node:child_process";
import { rmSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import { OwnServer, prepareDemoDatabase } from "./support/own-server";
import { localMinute, signInByHand } from "./support/http-client";
import { DEMO, signInAs } from "./support/accounts";

const run = promisify(execFile);
// Beside the shared server's port (E2E_PORT, default 3100), so checkouts running side by side do not collide.
const PORT = Number(process.env.E2E_BACKUP_PORT ?? Number(process.env.E2E_PORT ?? 3100) + 2);
const DIR = path.resolve(`data/e2e-backup-${PORT}`);
const BACKUP = path.join(DIR, "backups", "during-writes.db");
const server = new OwnServer(PORT, DIR);

test.use({ baseURL: server.baseURL });
test.describe.configure({ timeout: 120_000 });

test.afterAll(async () => {
  await server.kill();
});

const samplesOf = (i: number) => 10 + (i % 5) * 25;

function sessionBody(i: number) {
  const n = samplesOf(i);
  return {
    coilId: "coil-KM-06",
    startedAt: localMinute(30 + i),
    supplyVoltageV: 24,
    supplyCurrentA: 1.2,
    durationS: "10 min",
    ambientTempC: 21,
    notes: `backup-stream ${i} samples=${n}`,
    samples: Array.from({ length: n }, (_, k) => `${k * 5}, ${(21 + k * 0.1).toFixed(1)}`).join("\n"),
  };
}

/** npm run <script> -- <args> against this spec's database; resolves with the exit code and output. */
async function npmRun(script: string, ...args: string[]) {
  try {
    const { stdout, stderr } = await run("npm", ["run", "--silent", script, "--", ...args], { env: server.env });
    return { code: 0, output: stdout + stderr };
  } catch (error) {
    const failed = error as { code?: number; stdout?: string; stderr?: string };
    return { code: failed.code ?? -1, output: (failed.stdout ?? "") + (failed.stderr ?? "") };
  }
}

function sessionsIn(file: string) {
  const db = new Database(file, { readonly: true });
  try {
    const rows = db
      .prepare(`SELECT s."id", s."notes", (SELECT COUNT(*) FROM "HeatSinkSample" h WHERE h."sessionId" = s."id") AS "samples" FROM "RunSession" s WHERE s."notes" LIKE 'backup-stream %'`)
      .all() as { id: string; notes: string; samples: number }[];
    return { integrity: db.pragma("integrity_check", { simple: true }), foreignKeyProblems: db.pragma("foreign_key_check") as unknown[], rows };
  } finally {
    db.close();
  }
}

test("a backup taken under a stream of writes is consistent, and restoring it brings the data back", async ({ page }) => {
  server.useCopyOf(prepareDemoDatabase(path.join(DIR, "template")));
  rmSync(BACKUP, { force: true });
  await server.start();
  const cookie = await signInByHand(server.baseURL, DEMO.member.email, DEMO.member.password);

  // A stream of session writes, 4 in flight, until told to stop.
  const acknowledged: { id: string; i: number; sentAt: number; at: number }[] = [];
  let next = 0;
  let stop = false;
  const post = async (i: number) => {
    const sentAt = Date.now();
    const response = await fetch(`${server.baseURL}/api/sessions`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(sessionBody(i)) });
    expect(response.status, await response.clone().text()).toBe(201);
    const { data } = (await response.json()) as { data: { id: string } };
    acknowledged.push({ id: data.id, i, sentAt, at: Date.now() });
  };
  const stream = Promise.all(
    Array.from({ length: 4 }, async () => {
      while (!stop) await post(next++);
    }),
  );
  await expect.poll(() => acknowledged.length, { timeout: 30_000 }).toBeGreaterThanOrEqual(20);

  const backupStarted = Date.now();
  const before = acknowledged.filter((a) => a.at < backupStarted);
  const backup = await npmRun("db:backup", BACKUP);
  const backupEnded = Date.now();
  const duringBackup = acknowledged.filter((a) => a.at >= backupStarted && a.at <= backupEnded).length;
  // Some writes sent after the backup too (so certainly not in it): the restore visibly goes back to its moment.
  await expect.poll(() => acknowledged.filter((a) => a.sentAt > backupEnded).length, { timeout: 30_000 }).toBeGreaterThanOrEqual(5);
  stop = true;
  await stream;
  expect(backup.code, backup.output).toBe(0);
  expect(backup.output).toContain("integrity check ok");

  const copy = sessionsIn(BACKUP);
  expect(copy.integrity).toBe("ok");
  expect(copy.foreignKeyProblems).toEqual([]);
  const inCopy = new Map(copy.rows.map((row) => [row.id, row]));
  for (const a of before) expect(inCopy.get(a.id), `session ${a.i}, acknowledged before the backup began`).toBeDefined();
  for (const row of copy.rows) expect(row.samples, `session ${row.id} in the backup`).toBe(Number(/samples=(\d+)/.exec(row.notes)![1]));
  const after = acknowledged.filter((a) => a.sentAt > backupEnded);
  for (const a of after) expect(inCopy.has(a.id), `session ${a.i}, sent after the backup ended`).toBe(false);
  console.log(
    `[backup] ${acknowledged.length} sessions acknowledged in all; ${before.length} before the backup, ${duringBackup} while it ran (${backupEnded - backupStarted} ms), ${after.length} sent after it; the backup holds ${copy.rows.length}, all whole`,
  );

  // Restoring under the running app is refused and changes nothing.
  const refused = await npmRun("db:restore", BACKUP);
  expect(refused.code, refused.output).toBe(3);
  expect(refused.output).toContain("is open in another process");
  expect(sessionsIn(server.dbFile).rows).toHaveLength(acknowledged.length);

  await server.stop();
  const restored = await npmRun("db:restore", BACKUP);
  expect(restored.code, restored.output).toBe(0);
  const live = sessionsIn(server.dbFile);
  expect(live.integrity).toBe("ok");
  expect(live.rows.map((r) => r.id).sort()).toEqual(copy.rows.map((r) => r.id).sort());

  await server.start();
  await signInAs(page, "member");
  const first = before[0]!;
  await page.goto(`/sessions/${first.id}`);
  await expect(page.getByText(`backup-stream ${first.i} `)).toBeVisible();
  const gone = await page.goto(`/sessions/${after[0]!.id}`);
  expect(gone?.status()).toBe(404);
  await page.goto("/coils/KM-06");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("KM-06");
  await server.stop();
});
