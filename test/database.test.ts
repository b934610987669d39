import { describe, expect, it } from "vitest";
import { testDb } from "./support/db";

describe("the SQLite file built from the migrations", () => {
  it("runs in write-ahead-log mode with foreign keys enforced", async () => {
    const journal = await testDb.$queryRawUnsafe<{ journal_mode: string }[]>("PRAGMA journal_mode");
    const fk = await testDb.$queryRawUnsafe<{ foreign_keys: bigint | number }[]>("PRAGMA foreign_keys");
    expect(journal[0]?.journal_mode).toBe("wal");
    expect(Number(fk[0]?.foreign_keys)).toBe(1);
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
