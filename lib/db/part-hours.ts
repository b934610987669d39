/**
 * The fleet reliability page's operating hours per fitted part, summed in the database: the durations (negative ones
 * as 0) of the sessions run on the part's coil while it was fitted (installedAt ≤ startedAt < removedAt, as
 * lib/analysis/fitted-parts.ts `isFittedAt` has it). The page used to read every session of the site to add them up.
 *
 * Raw SQL because the query API cannot join a part to its coil's sessions by time. Portable (quoted identifiers, no
 * provider-only functions) and narrowed by the site; test/part-hours.test.ts checks it against the sums worked out
 * from every session read through the query API, on SQLite and PostgreSQL.
 */
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
import type { SiteScope } from "./site-scope";

/** Seconds run while fitted, by component id, for the scope's site's parts that were fitted for at least one session. */
export async function readPartFittedSeconds(scope: SiteScope): Promise<Map<string, number>> {
  const rows = await readRows<{ componentId: string; seconds: unknown }>(Prisma.sql`
    SELECT p.id AS "componentId", sum(CASE WHEN s."durationS" > 0 THEN s."durationS" ELSE 0 END) AS seconds
    FROM "Component" p
    JOIN "Coil" c ON c.id = p."coilId"
    JOIN "RunSession" s ON s."coilId" = p."coilId" AND s."startedAt" >= p."installedAt" AND (p."removedAt" IS NULL OR s."startedAt" < p."removedAt")
    WHERE c."siteId" = ${scope.siteId}
    GROUP BY p.id`);
  // A sum is a number on both adapters, or a bigint when SQLite's sum of whole numbers stays an integer.
  return new Map(rows.map((r) => [r.componentId, typeof r.seconds === "bigint" ? Number(r.seconds) : Number(r.seconds ?? 0)]));
}
