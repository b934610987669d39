import { describe, expect, it } from "vitest";
import { testDb } from "./support/db";
import { databaseProvider } from "@/lib/config/database-url";

const provider = databaseProvider(process.env.DATABASE_URL);

describe("the database built from the migrations", () => {
  it.runIf(provider === "sqlite")("SQLite: runs in write-ahead-log mode with foreign keys enforced", async () => {
    const journal = await testDb.$queryRawUnsafe<{ journal_mode: string }[]>("PRAGMA journal_mode");
    const fk = await testDb.$queryRawUnsafe<{ foreign_keys: bigint | number }[]>("PRAGMA foreign_keys");
    expect(journal[0]?.journal_mode).toBe("wal");
    expect(Number(fk[0]?.foreign_keys)).toBe(1);
  });

  it.runIf(provider === "postgresql")("PostgreSQL: every table of the schema exists with its foreign keys", async () => {
    const tables = await testDb.$queryRawUnsafe<{ table_name: string }[]>(
      "SELECT table_name::text FROM information_schema.tables WHERE table_schema = 'public' AND table_name NOT LIKE '\\_prisma%'",
    );
    expect(tables.map((t) => t.table_name).sort()).toContain("RunSession");
    const [fk] = await testDb.$queryRawUnsafe<{ n: bigint }[]>(
      "SELECT COUNT(*) AS n FROM information_schema.table_constraints WHERE table_schema = 'public' AND constraint_type = 'FOREIGN KEY'",
    );
    expect(Number(fk!.n)).toBeGreaterThan(10);
  });

  it("refuses a session for a coil that does not exist (foreign key)", async () => {
    await expect(
      testDb.runSession.create({
        data: { coilId: "no-such-coil", startedAt: new Date(), supplyVoltageV: 24, supplyCurrentA: 1, durationS: 60, ambientTempC: 20 },
      }),
    ).rejects.toThrow();
    expect(await testDb.runSession.count({ where: { coilId: "no-such-coil" } })).toBe(0);
  });
});
