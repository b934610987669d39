/**
 * The district view's figures, counted by the database per site, against the records themselves: the demo network
 * (the club and the school) with a few records changed so every figure is non-trivial. Clearances are checked against
 * lib/analysis's own rule (describeClearanceState), read coil by coil, so the SQL and the dashboard's rule agree.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { mainScope, makeOrganisationAdmin, makeUser, resetDatabase, testDb } from "./support/db";
import { loadDemoDataset } from "@/lib/db/demo-loader";
import { getDistrictHealth } from "@/lib/db/district";
import { SiteAccessError } from "@/lib/db/users";
import { DEFAULT_SITE_ID } from "@/lib/db/site-scope";
import { describeClearanceState } from "@/lib/analysis/clearance-state";
import { findPartReplacements } from "@/lib/analysis/clearance-facts";
import { generateDemoDataset } from "@/prisma/demo/generate";
import { DEMO_PEOPLE, type DemoPersonKey } from "@/prisma/demo/people";

const DAY = 86_400_000;
const NOW = new Date(Date.UTC(2025, 4, 1));
const SCHOOL = "site-fenwick";
let organiserId = "";

/** Cleared coils per site by lib/analysis's rule, one coil at a time. */
async function clearedByAnalysis(now: Date): Promise<Map<string, number>> {
  const counts = new Map<string, number>();
  const coils = await testDb.coil.findMany({ include: { clearances: { orderBy: [{ decidedAt: "desc" }, { id: "desc" }], take: 1 }, failures: true, components: true } });
  for (const coil of coils) {
    const latest = coil.clearances[0] ?? null;
    const state = describeClearanceState(latest, coil.failures, findPartReplacements(coil.components), now);
    if (state.kind === "valid") counts.set(coil.siteId, (counts.get(coil.siteId) ?? 0) + 1);
  }
  return counts;
}

beforeAll(async () => {
  await resetDatabase();
  const passwordHashes = Object.fromEntries(DEMO_PEOPLE.map((p) => [p.key, "not-a-real-hash"])) as Record<DemoPersonKey, string>;
  await loadDemoDataset(generateDemoDataset({ anchor: NOW, passwordHashes }));
  organiserId = (await testDb.user.findFirstOrThrow({ where: { organisationAdmin: true } })).id;
  // Stored judgements for three club coils (one past its validUntil); the rest never judged.
  const judge = async (tag: string, health: string, validUntil: Date | null = null) => {
    const coil = await testDb.coil.findFirstOrThrow({ where: { tag }, include: { summary: true } });
    await testDb.coilSummary.update({ where: { coilId: coil.id }, data: { health, computedRevision: coil.summary!.revision, computedAt: new Date(NOW.getTime() - DAY), validUntil } });
  };
  await judge("KM-01", "fine", new Date(NOW.getTime() - 3_600_000));
  await judge("KM-04", "watch");
  await judge("KM-05", "hold");
  await judge("FS-02", "not enough data");
  // An open failure at the school, after its classroom coil's clearance: that clearance lapses.
  const fs01 = await testDb.coil.findFirstOrThrow({ where: { tag: "FS-01" } });
  await testDb.failure.create({ data: { coilId: fs01.id, occurredAt: new Date(NOW.getTime() - DAY), mode: "over_temperature", symptoms: "Arc faded; heat sink too hot to touch" } });
}, 60_000);

describe("the district view", () => {
  it("counts each site's coils, stored health and out-of-date judgements", async () => {
    const rows = await getDistrictHealth(mainScope(organiserId), NOW);
    expect(rows.map((r) => r.site.name)).toEqual(["Fenwick Street School", "Kettlewell Maker Collective"]);
    const [school, club] = rows as [(typeof rows)[0], (typeof rows)[0]];
    expect(club).toMatchObject({ coils: 7, health: { fine: 1, watch: 1, hold: 1, notEnoughData: 0 }, outOfDate: 5 });
    expect(school).toMatchObject({ coils: 2, health: { fine: 0, watch: 0, hold: 0, notEnoughData: 1 }, outOfDate: 1 });
    expect(club.oldestJudgementAt?.toISOString()).toBe(new Date(NOW.getTime() - DAY).toISOString());
  });

  it("counts open failures and loans at the lending site, overdue by the clock", async () => {
    const outAt = await testDb.loan.findFirstOrThrow({ where: { returnedAt: null } });
    const before = await getDistrictHealth(mainScope(organiserId), new Date(outAt.expectedBackAt.getTime() - 1000));
    const after = await getDistrictHealth(mainScope(organiserId), new Date(outAt.expectedBackAt.getTime() + 1000));
    const club = (rows: typeof before) => rows.find((r) => r.site.id === DEFAULT_SITE_ID)!;
    const school = (rows: typeof before) => rows.find((r) => r.site.id === SCHOOL)!;
    expect([club(before).onLoan, club(before).overdueLoans]).toEqual([1, 0]);
    expect([club(after).onLoan, club(after).overdueLoans]).toEqual([1, 1]);
    expect([school(after).onLoan, school(after).openFailures, club(after).openFailures]).toEqual([0, 1, 0]);
  });

  it("counts cleared coils exactly as lib/analysis judges each clearance, before and after a lapse or expiry", async () => {
    for (const now of [NOW, new Date(NOW.getTime() - 2 * DAY), new Date(NOW.getTime() + 400 * DAY)]) {
      const expected = await clearedByAnalysis(now);
      const rows = await getDistrictHealth(mainScope(organiserId), now);
      expect(Object.fromEntries(rows.map((r) => [r.site.id, r.cleared])), now.toISOString()).toEqual({ [DEFAULT_SITE_ID]: expected.get(DEFAULT_SITE_ID) ?? 0, [SCHOOL]: expected.get(SCHOOL) ?? 0 });
    }
    // Before the failure the school's coil stood; after it, it does not; a year on, nothing stands.
    expect((await clearedByAnalysis(new Date(NOW.getTime() - 2 * DAY))).get(SCHOOL)).toBe(1);
    expect((await clearedByAnalysis(NOW)).get(SCHOOL)).toBeUndefined();
    expect((await clearedByAnalysis(NOW)).get(DEFAULT_SITE_ID)).toBeGreaterThan(0);
    expect((await clearedByAnalysis(new Date(NOW.getTime() + 400 * DAY))).size).toBe(0);
  });

  it("is refused to anyone but an organisation admin, site admins included", async () => {
    const admin = await makeUser("admin@district.test", "admin");
    await expect(getDistrictHealth(mainScope(admin.id), NOW)).rejects.toBeInstanceOf(SiteAccessError);
    const other = await makeOrganisationAdmin("org@district.test");
    await testDb.user.update({ where: { id: other.id }, data: { active: false } });
    await expect(getDistrictHealth(mainScope(other.id), NOW)).rejects.toBeInstanceOf(SiteAccessError);
  });
});
