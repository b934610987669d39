/**
 * The district view: every site's fleet at a glance, for organisation admins. Each figure is counted by the database,
 * grouped by the coil's site (a handful of aggregate statements, whatever the number of sites or coils).
 *
 * Health is read from the stored per-coil summary (coil-summary.ts) as each site's dashboard last worked it out; it is
 * not recomputed here. Recomputing every stale coil of every site on each visit would make a glance cost as much as
 * opening every site's dashboard cold; instead each site's row says how many of its judgements are out of date (the
 * coil was written to since, or the clock passed the judgement's validUntil, or it was never judged), and opening the
 * site's dashboard brings them up to date. Open failures, loans and clearances are worked out now, from the records.
 */
import { prisma } from "./client";
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
import type { SiteScope } from "./site-scope";
import type { SiteRef } from "./site-access";
import { isOrganisationAdmin, SiteAccessError } from "./users";

export interface SiteFleetHealth {
  site: SiteRef;
  coils: number;
  health: { fine: number; watch: number; hold: number; notEnoughData: number };
  /** Coils with no stored judgement yet, or one older than their latest records or past its validUntil. */
  outOfDate: number;
  /** When the oldest stored judgement of the site was worked out; null when none is stored. */
  oldestJudgementAt: Date | null;
  openFailures: number;
  onLoan: number;
  overdueLoans: number;
  /** Coils whose latest clearance is "cleared" and still stands: not expired, no failure or part fitted since. */
  cleared: number;
}

type Count = number | bigint | string;

const HEALTH_KEY: Record<string, keyof SiteFleetHealth["health"]> = { fine: "fine", watch: "watch", hold: "hold", "not enough data": "notEnoughData" };

export async function getDistrictHealth(scope: SiteScope, now: Date = new Date()): Promise<SiteFleetHealth[]> {
  if (!(await isOrganisationAdmin(prisma, scope.actorId))) throw new SiteAccessError("The district view needs an organisation admin.");
  const [sites, health, failures, loans, cleared] = await Promise.all([
    prisma.site.findMany({ select: { id: true, slug: true, name: true }, orderBy: { name: "asc" } }),
    readRows<{ siteId: string; health: string | null; coils: Count; outOfDate: Count; oldest: Date | null }>(Prisma.sql`
      SELECT c."siteId" AS "siteId", s.health AS health, COUNT(*) AS coils,
             SUM(CASE WHEN s."computedRevision" IS NULL OR s."computedRevision" <> s.revision
                        OR (s."validUntil" IS NOT NULL AND s."validUntil" <= ${now}) THEN 1 ELSE 0 END) AS "outOfDate",
             MIN(s."computedAt") AS oldest
      FROM "Coil" c LEFT JOIN "CoilSummary" s ON s."coilId" = c.id
      GROUP BY c."siteId", s.health`),
    readRows<{ siteId: string; open: Count }>(Prisma.sql`
      SELECT c."siteId" AS "siteId", COUNT(*) AS open
      FROM "Failure" f JOIN "Coil" c ON c.id = f."coilId"
      WHERE f.status = 'open'
      GROUP BY c."siteId"`),
    // Counted at the lending site (the coil's), where the steward answers for it.
    readRows<{ siteId: string; out: Count; overdue: Count }>(Prisma.sql`
      SELECT c."siteId" AS "siteId", COUNT(*) AS out, SUM(CASE WHEN l."expectedBackAt" < ${now} THEN 1 ELSE 0 END) AS overdue
      FROM "Loan" l JOIN "Coil" c ON c.id = l."coilId"
      WHERE l."returnedAt" IS NULL
      GROUP BY c."siteId"`),
    // The rule of lib/calc/clearance-lapse.ts in SQL: the latest decision (ties on the instant broken by id, as the
    // dashboard's readLatestClearances), cleared, before its expiry, with no failure and no part fitted after the
    // coil's first parts between signing and now.
    readRows<{ siteId: string; cleared: Count }>(Prisma.sql`
      SELECT c."siteId" AS "siteId", COUNT(*) AS cleared
      FROM "Clearance" k JOIN "Coil" c ON c.id = k."coilId"
      WHERE k.verdict = 'cleared' AND k."validUntil" > ${now}
        AND NOT EXISTS (SELECT 1 FROM "Clearance" d WHERE d."coilId" = k."coilId"
                          AND (d."decidedAt" > k."decidedAt" OR (d."decidedAt" = k."decidedAt" AND d.id > k.id)))
        AND NOT EXISTS (SELECT 1 FROM "Failure" f WHERE f."coilId" = k."coilId" AND f."occurredAt" >= k."decidedAt" AND f."occurredAt" <= ${now})
        AND NOT EXISTS (SELECT 1 FROM "Component" p WHERE p."coilId" = k."coilId" AND p."installedAt" >= k."decidedAt" AND p."installedAt" <= ${now}
                          AND p."installedAt" > (SELECT MIN(q."installedAt") FROM "Component" q WHERE q."coilId" = k."coilId"))
      GROUP BY c."siteId"`),
  ]);
  const bySite = new Map<string, SiteFleetHealth>(
    sites.map((site) => [
      site.id,
      { site, coils: 0, health: { fine: 0, watch: 0, hold: 0, notEnoughData: 0 }, outOfDate: 0, oldestJudgementAt: null, openFailures: 0, onLoan: 0, overdueLoans: 0, cleared: 0 },
    ]),
  );
  for (const row of health) {
    const site = bySite.get(row.siteId);
    if (!site) continue; // a site created while the page was read
    site.coils += Number(row.coils);
    site.outOfDate += Number(row.outOfDate);
    const key = row.health === null ? undefined : HEALTH_KEY[row.health];
    if (key) site.health[key] += Number(row.coils);
    const oldest = row.oldest === null ? null : new Date(row.oldest);
    if (oldest && (!site.oldestJudgementAt || oldest < site.oldestJudgementAt)) site.oldestJudgementAt = oldest;
  }
  for (const row of failures) if (bySite.has(row.siteId)) bySite.get(row.siteId)!.openFailures = Number(row.open);
  for (const row of loans) {
    const site = bySite.get(row.siteId);
    if (site) Object.assign(site, { onLoan: Number(row.out), overdueLoans: Number(row.overdue) });
  }
  for (const row of cleared) if (bySite.has(row.siteId)) bySite.get(row.siteId)!.cleared = Number(row.cleared);
  return [...bySite.values()];
}
