/**
 * The fleet reliability page's hours per part, summed in the database (lib/db/part-hours.ts, raw SQL) against the
 * answer worked out from every session read through the query API (getFleetHistory + computePartExposures, what the
 * page did before), on SQLite and PostgreSQL: the demo network's two sites, plus a third site whose coil shares a tag
 * with the club's and has a session exactly at a part's removal (not fitted then) and one at its installation (fitted).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { createSite, makeUser, mainScope, resetDatabase, siteScope, testDb } from "./support/db";
import { makeCleanCoil } from "./fleet-fixtures";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";
import { getFleetHistory } from "@/lib/db/coil-history";
import { getPartReliability } from "@/lib/db/fleet";
import { readPartFittedSeconds } from "@/lib/db/part-hours";
import { computePartExposures } from "@/lib/analysis/part-hours";
import type { SiteScope } from "@/lib/db/site-scope";

const now = new Date("2026-11-30T12:00:00Z");
let annex: SiteScope = mainScope(null);

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: new Date(Date.UTC(2025, 4, 1)), passwordHashes }));
  const site = await createSite("annex");
  annex = siteScope(site.id, null);
  const steward = await makeUser("annex.steward@club.test", "steward", "Annex Steward", site.id);
  const coil = await makeCleanCoil("KM-01", now, steward.id, site.id);
  const installedAt = new Date("2026-11-25T10:00:00Z");
  const removedAt = new Date("2026-11-27T10:00:00Z");
  await testDb.component.create({ data: { coilId: coil.id, kind: "switch", partNumber: "irfp 260n", installedAt, removedAt } });
  for (const [startedAt, durationS] of [[installedAt, 600], [removedAt, 900], [new Date("2026-11-26T10:00:00Z"), -5]] as const) {
    await testDb.runSession.create({ data: { coilId: coil.id, startedAt, supplyVoltageV: 120, supplyCurrentA: 2, durationS, ambientTempC: 20 } });
  }
});

describe("part hours summed in the database", () => {
  it("match the sums over every session read through the query API, at each site", async () => {
    for (const scope of [mainScope(null), siteScope("site-fenwick", null), annex]) {
      const histories = await getFleetHistory(scope);
      const fromSessions = computePartExposures(histories, []);
      const summed = await readPartFittedSeconds(scope);
      expect(fromSessions.length).toBeGreaterThan(0);
      for (const row of fromSessions) expect((summed.get(row.componentId) ?? 0) / 3600).toBeCloseTo(row.operatingHours, 9);
      // Only the scope's own parts, and only those that ran.
      const ids = new Set(histories.flatMap((h) => h.components.map((c) => c.id)));
      for (const id of summed.keys()) expect(ids.has(id)).toBe(true);
    }
  });

  it("count a session at installation, not one at removal, and a negative duration as none", async () => {
    const part = await testDb.component.findFirstOrThrow({ where: { partNumber: "irfp 260n", coil: { siteId: annex.siteId } } });
    expect((await readPartFittedSeconds(annex)).get(part.id)).toBe(600);
  });

  it("leave the reliability page's table as it was computed from every session", async () => {
    for (const scope of [mainScope(null), annex]) {
      const { parts } = await getPartReliability(scope);
      const failures = await testDb.failure.findMany({ where: { coil: { siteId: scope.siteId } }, select: { componentId: true, mode: true } });
      const before = computePartExposures(await getFleetHistory(scope), failures);
      const hoursByKey = new Map<string, number>();
      const shownNumber = new Map<string, string>();
      for (const row of before) {
        hoursByKey.set(row.partKey, (hoursByKey.get(row.partKey) ?? 0) + row.operatingHours);
        shownNumber.set(row.partKey, row.partNumber);
      }
      expect(parts.length).toBe(hoursByKey.size);
      for (const p of parts) {
        expect(p.operatingHours).toBeCloseTo(hoursByKey.get(p.partKey)!, 9);
        expect(p.partNumber).toBe(shownNumber.get(p.partKey));
      }
    }
  });
});
