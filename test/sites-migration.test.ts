/**
 * The sites migration (20261204090000_sites) on an existing single-club database: a copy of the demo club as it was
 * before sites, built with the migrations before it, then migrated. Every coil must land in the default site, every
 * user keep their role there, admins become organisation admins, and no table lose or gain a row. Runs on the
 * database of the pass: a scratch SQLite file, or a scratch PostgreSQL database beside the test database.
 *
 * The old rows are today's demo generator's club rows put back into the old shape (the club's part of the generator
 * is unchanged by sites: same seeds, same people, same roles), written with plain SQL through the database's own
 * driver, since today's Prisma client only knows the new schema. Migrations are applied as `migrate deploy` would:
 * each folder's migration.sql in name order.
 */
import { mkdirSync, readdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "./support/db";
import { INTEGRATION_DB_FILE } from "./support/paths";
import { databaseProvider } from "@/lib/config/database-url";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import type { DemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";

const SITES_MIGRATION = "20261204090000_sites";
type Row = Record<string, unknown>;

/** Just enough of a database to build the old schema and fill it: the driver itself, no Prisma. */
interface RawDatabase {
  url: string;
  exec(sql: string): Promise<void>;
  insert(table: string, rows: readonly Row[]): Promise<void>;
  tables(): Promise<string[]>;
  count(table: string): Promise<number>;
  close(): Promise<void>;
}

async function scratchSqlite(): Promise<RawDatabase> {
  const file = path.join(path.dirname(INTEGRATION_DB_FILE), "sites-migration.db");
  mkdirSync(path.dirname(file), { recursive: true });
  for (const suffix of ["", "-wal", "-shm", "-journal"]) rmSync(file + suffix, { force: true });
  const db = new Database(file);
  // As Prisma's SQLite adapter stores them.
  const value = (v: unknown) => (v instanceof Date ? v.toISOString().replace("Z", "+00:00") : typeof v === "boolean" ? Number(v) : v);
  return {
    url: `file:${file}`,
    exec: async (sql) => void db.exec(sql),
    insert: async (table, rows) => {
      db.transaction(() => {
        for (const row of rows) {
          const columns = Object.keys(row);
          db.prepare(`INSERT INTO "${table}" (${columns.map((c) => `"${c}"`).join(", ")}) VALUES (${columns.map(() => "?").join(", ")})`).run(...columns.map((c) => value(row[c])));
        }
      })();
    },
    tables: async () => (db.prepare(`SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> '_prisma_migrations'`).all() as { name: string }[]).map((t) => t.name),
    count: async (table) => (db.prepare(`SELECT COUNT(*) AS n FROM "${table}"`).get() as { n: number }).n,
    close: async () => void db.close(),
  };
}

async function scratchPostgres(): Promise<RawDatabase> {
  const admin = new pg.Client({ connectionString: process.env.DATABASE_URL });
  const url = new URL(process.env.DATABASE_URL!);
  const name = `${url.pathname.slice(1)}_sites_migration`;
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  url.pathname = `/${name}`;
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  // TIMESTAMP(3) columns hold UTC without a zone, as Prisma writes them (node-pg would send a Date in local time).
  const value = (v: unknown) => (v instanceof Date ? v.toISOString().replace("Z", "") : v);
  return {
    url: url.toString(),
    exec: async (sql) => void (await client.query(sql)),
    insert: async (table, rows) => {
      // Many rows a statement, grouped by the columns they name, so an omitted column still gets its default.
      const byColumns = new Map<string, Row[]>();
      for (const row of rows) {
        const names = Object.keys(row).join(",");
        (byColumns.get(names) ?? byColumns.set(names, []).get(names)!).push(row);
      }
      for (const [names, group] of byColumns) {
        const columns = names.split(",");
        for (let i = 0; i < group.length; i += 500) {
          const params: unknown[] = [];
          const tuples = group.slice(i, i + 500).map((row) => `(${columns.map((c) => (params.push(value(row[c])), `$${params.length}`)).join(", ")})`);
          await client.query(`INSERT INTO "${table}" (${columns.map((c) => `"${c}"`).join(", ")}) VALUES ${tuples.join(", ")}`, params);
        }
      }
    },
    tables: async () => (await client.query<{ name: string }>(`SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_name <> '_prisma_migrations'`)).rows.map((t) => t.name),
    count: async (table) => Number((await client.query<{ n: string }>(`SELECT COUNT(*) AS n FROM "${table}"`)).rows[0]!.n),
    close: () => client.end(),
  };
}

function migrationFolders(postgres: boolean): string[] {
  const dir = postgres ? path.resolve("prisma/postgresql/migrations") : path.resolve("prisma/migrations");
  return readdirSync(dir, { withFileTypes: true })
    .filter((entry) => entry.isDirectory())
    .map((entry) => path.join(dir, entry.name))
    .sort();
}

/** The demo club as the database held it before sites: the club's rows only, users with their one role, no site columns. */
function clubBeforeSites(dataset: DemoDataset) {
  const clubRole = new Map(dataset.memberships.filter((m) => m.siteId === DEFAULT_SITE_ID).map((m) => [m.userId, m.role]));
  const coilIds = new Set(dataset.coils.filter((c) => c.siteId === DEFAULT_SITE_ID).map((c) => c.id!));
  const sessionIds = new Set(dataset.sessions.filter((s) => coilIds.has(s.coilId)).map((s) => s.id!));
  const sweepIds = new Set(dataset.sweeps.filter((s) => coilIds.has(s.coilId)).map((s) => s.id!));
  const ofCoil = <T extends { coilId: string }>(rows: T[]) => rows.filter((r) => coilIds.has(r.coilId));
  const withoutSite = <T extends { siteId?: unknown }>({ siteId: _siteId, ...rest }: T) => rest;
  const replacedBy = new Map(dataset.componentReplacements.map((link) => [link.id, link.replacedById]));
  const sessionLoan = new Map(dataset.sessionLoans.map((link) => [link.sessionId, link.loanId]));
  return {
    User: dataset.users
      .filter((u) => clubRole.has(u.id!))
      .map(({ organisationAdmin: _organisationAdmin, ...u }) => ({ ...u, role: clubRole.get(u.id!), updatedAt: u.createdAt })),
    ClearancePolicy: dataset.policies.map(withoutSite),
    Coil: dataset.coils.filter((c) => coilIds.has(c.id!)).map((c) => ({ ...withoutSite(c), updatedAt: c.createdAt })),
    TopLoad: ofCoil(dataset.topLoads),
    Component: ofCoil(dataset.components),
    Sweep: ofCoil(dataset.sweeps),
    SweepPoint: dataset.sweepPoints.filter((p) => sweepIds.has(p.sweepId)),
    SweepResonance: dataset.sweepResonances.filter((r) => sweepIds.has(r.sweepId)),
    RunSession: ofCoil(dataset.sessions),
    HeatSinkSample: dataset.samples.filter((s) => sessionIds.has(s.sessionId)),
    Failure: ofCoil(dataset.failures),
    Clearance: ofCoil(dataset.clearances),
    Loan: ofCoil(dataset.loans),
    AuditEvent: dataset.audit.filter((a) => a.siteId === DEFAULT_SITE_ID).map(withoutSite),
    replacedBy,
    sessionLoan,
  };
}

/** Parents before children, as the old schema's foreign keys need. */
const OLD_TABLE_ORDER = ["User", "ClearancePolicy", "Coil", "TopLoad", "Component", "Sweep", "SweepPoint", "SweepResonance", "RunSession", "HeatSinkSample", "Failure", "Clearance", "Loan", "AuditEvent"] as const;

const postgres = databaseProvider(process.env.DATABASE_URL) === "postgresql";
let raw: RawDatabase;
let old: ReturnType<typeof clubBeforeSites>;
const countsBefore = new Map<string, number>();
const tablesBefore: string[] = [];
let migrated: ReturnType<typeof openDatabase>;

beforeAll(async () => {
  raw = postgres ? await scratchPostgres() : await scratchSqlite();
  const folders = migrationFolders(postgres);
  const sitesAt = folders.findIndex((f) => path.basename(f) === SITES_MIGRATION);
  expect(sitesAt).toBeGreaterThan(0);
  for (const folder of folders.slice(0, sitesAt)) await raw.exec(readFileSync(path.join(folder, "migration.sql"), "utf8"));

  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, `hash-of-${p.key}`])) as Record<DemoPersonKey, string>;
  old = clubBeforeSites(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
  for (const table of OLD_TABLE_ORDER) await raw.insert(table, old[table] as Row[]);
  const { replacedBy, sessionLoan } = old;
  // Links inside a table, once both ends exist.
  for (const [id, successor] of replacedBy) await raw.exec(`UPDATE "Component" SET "replacedById" = '${successor}' WHERE id = '${id}'`);
  for (const [id, loanId] of sessionLoan) await raw.exec(`UPDATE "RunSession" SET "loanId" = '${loanId}' WHERE id = '${id}'`);

  tablesBefore.push(...(await raw.tables()).sort());
  for (const table of tablesBefore) countsBefore.set(table, await raw.count(table));
  await raw.exec(readFileSync(path.join(folders[sitesAt]!, "migration.sql"), "utf8"));
  migrated = openDatabase(raw.url);
}, 120_000);

afterAll(async () => {
  await migrated?.$disconnect();
  await raw?.close();
});

describe(`the sites migration on a single-club database (${postgres ? "PostgreSQL" : "SQLite"})`, () => {
  it("starts from the demo club with every kind of record", () => {
    expect(old.User.map((u) => u.role).sort()).toEqual(["admin", "member", "member", "member", "steward"]);
    expect(old.Coil.length).toBe(7);
    for (const table of ["SweepPoint", "HeatSinkSample", "Failure", "Clearance", "Loan", "AuditEvent"]) expect(countsBefore.get(table), table).toBeGreaterThan(0);
  });

  it("keeps every table's row count, and adds the default site with one membership per user", async () => {
    for (const table of tablesBefore) expect(await raw.count(table), table).toBe(countsBefore.get(table));
    expect((await raw.tables()).sort()).toEqual([...tablesBefore, "Site", "SiteMembership"].sort());
    expect(await migrated.site.findMany({ select: { id: true, slug: true, name: true } })).toEqual([{ id: DEFAULT_SITE_ID, slug: "main", name: "Main site" }]);
    expect(await migrated.siteMembership.count()).toBe(old.User.length);
  });

  it("puts every coil, and through it every record, in the default site", async () => {
    expect(await migrated.coil.groupBy({ by: ["siteId"], _count: { _all: true } })).toEqual([{ siteId: DEFAULT_SITE_ID, _count: { _all: old.Coil.length } }]);
    expect(await migrated.runSession.count({ where: { coil: { siteId: DEFAULT_SITE_ID } } })).toBe(old.RunSession.length);
    expect(await migrated.loan.count({ where: { borrowerSiteId: null } })).toBe(old.Loan.length);
    // The audit trail belongs to the site; the policy versions become the organisation's default.
    expect(await migrated.auditEvent.count({ where: { siteId: DEFAULT_SITE_ID } })).toBe(old.AuditEvent.length);
    expect(await migrated.clearancePolicy.count({ where: { siteId: null } })).toBe(old.ClearancePolicy.length);
  });

  it("keeps every user's role at the default site and makes the admins organisation admins", async () => {
    const users = await migrated.user.findMany({ select: { id: true, organisationAdmin: true, memberships: { select: { siteId: true, role: true } } } });
    expect(users).toHaveLength(old.User.length);
    for (const before of old.User) {
      const after = users.find((u) => u.id === before.id)!;
      expect(after.memberships, before.id).toEqual([{ siteId: DEFAULT_SITE_ID, role: before.role }]);
      expect(after.organisationAdmin, before.id).toBe(before.role === "admin");
    }
  });

  it("keeps the values themselves: timestamps, links inside a table, a coil's build", async () => {
    const coil = await migrated.coil.findUniqueOrThrow({ where: { siteId_tag: { siteId: DEFAULT_SITE_ID, tag: "KM-04" } } });
    const before = old.Coil.find((c) => c.tag === "KM-04")!;
    expect(coil.createdAt.toISOString()).toBe(new Date(before.createdAt as Date).toISOString());
    expect(coil.turns).toBe(before.turns);
    expect(await migrated.component.count({ where: { replacedById: { not: null } } })).toBe(old.replacedBy.size);
    const admin = await migrated.user.findUniqueOrThrow({ where: { email: "admin@kettlewell.example" } });
    expect(admin.passwordHash).toBe("hash-of-admin");
  });

  it.runIf(!postgres)("leaves no broken foreign key (SQLite rebuilt four tables with checks off)", async () => {
    expect(await migrated.$queryRawUnsafe("PRAGMA foreign_key_check")).toEqual([]);
  });
});
