/**
 * readRows (lib/db/adapter-read.ts) gives `$queryRaw`'s answer value for value, on SQLite and PostgreSQL: every
 * table of the demo network read whole (every column type the schema stores: text, integers, floats, booleans,
 * dates, JSON text, nullable columns), the computed values the raw readers use (counts, sums, max of a date, a CASE
 * that yields a boolean), arguments of every kind the readers pass (dates, numbers, strings, lists, null), and a
 * read that finds nothing.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { joinSql, MODEL_NAMES, rawSql, resetDatabase, sql, testDb, type Sql } from "./support/db";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { readRows } from "@/lib/db/adapter-read";

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
}, 120_000);

async function bothWays(statement: Sql) {
  const [fast, client] = await Promise.all([readRows<Record<string, unknown>>(statement), testDb.$queryRaw<Record<string, unknown>[]>(statement)]);
  return { fast, client };
}

describe("readRows answers as $queryRaw does", () => {
  it.each(MODEL_NAMES.map((table) => [table]))("every row and column of %s", async (table) => {
    const { fast, client } = await bothWays(sql`SELECT * FROM ${rawSql(`"${table}"`)} ORDER BY 1`);
    expect(fast).toEqual(client);
    // The comparison is only as good as the rows: the demo network fills the tables the pages read.
    if (["Coil", "RunSession", "Sweep", "Component", "Clearance", "Loan", "Failure", "User", "Site"].includes(table)) expect(fast.length).toBeGreaterThan(0);
  });

  it("keeps each value's type: bigint counts, Date dates, booleans, numbers, text and nulls", async () => {
    const { fast, client } = await bothWays(sql`
      SELECT c.id, c.tag, count(s.id) AS sessions, sum(s."durationS") AS seconds, max(s."startedAt") AS "lastAt", min(s."supplyVoltageV") AS "lowestV",
             CASE WHEN count(s.id) > 0 THEN ${true} ELSE ${false} END AS "hasSessions", max(s.notes) AS "someNote", max(s."runningFrequencyHz") AS "runningHz"
      FROM "Coil" c LEFT JOIN "RunSession" s ON s."coilId" = c.id
      GROUP BY c.id, c.tag ORDER BY c.tag`);
    expect(fast).toEqual(client);
    expect(typeof fast[0]!.sessions).toBe(typeof client[0]!.sessions);
    expect(fast.some((row) => row.sessions !== 0n)).toBe(true);
  });

  it("passes dates, numbers, strings, null and lists as arguments", async () => {
    const since = new Date(Date.UTC(2025, 0, 1));
    const tags = ["KM-01", "KM-02", "FS-01"];
    const { fast, client } = await bothWays(sql`
      SELECT s.id, s."startedAt", s."supplyVoltageV", c.tag FROM "RunSession" s JOIN "Coil" c ON c.id = s."coilId"
      WHERE s."startedAt" >= ${since} AND s."supplyVoltageV" > ${1.5} AND c.tag IN (${joinSql(tags)}) AND (s.notes = ${null}) IS NOT TRUE AND COALESCE(s.notes, ${""}) <> ${"never"}
      ORDER BY s."startedAt", s.id LIMIT 200`);
    expect(fast).toEqual(client);
    expect(fast.length).toBeGreaterThan(0);
    expect(fast[0]!.startedAt).toBeInstanceOf(Date);
  });

  it("answers an empty list for a read that finds nothing", async () => {
    const { fast, client } = await bothWays(sql`SELECT id, tag FROM "Coil" WHERE tag = ${"no such coil"}`);
    expect(fast).toEqual([]);
    expect(client).toEqual([]);
  });
});
