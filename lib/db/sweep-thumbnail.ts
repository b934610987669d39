/**
 * One sweep's readings for the coil page's small |Z| picture: only that sweep's points (by its (sweepId) index) and
 * the two figures |Z| is worked out with. Raw, as the coil page's other reads (lib/db/raw-read.ts says why).
 */
import { readRows } from "./adapter-read";
import { Prisma } from "./generated/client";
import { rawCount } from "./raw-read";
import type { SiteScope } from "./site-scope";

export interface SweepThumbnailRecords {
  id: string;
  takenAt: Date;
  seriesResistanceOhm: number;
  sourceAmplitudeV: number;
  points: { frequencyHz: number; amplitudeV: number }[];
}

/**
 * Above this many readings the picture is read already thinned: the points in frequency order are cut into
 * THUMBNAIL_BUCKETS runs and each run gives its lowest and highest reading at the run's middle frequency. |Z| rises
 * with the divider's reading, so that keeps every peak and dip a 180-pixel picture can show (the same min/max rule
 * as lib/analysis/decimate-min-max.ts, done by the database so a 100 000-point sweep is not read whole per page view).
 */
export const THUMBNAIL_FULL_READ_MAX = 2_000;
export const THUMBNAIL_BUCKETS = 400;

/** Null for no such sweep of a coil at the scope's site. */
export async function readSweepThumbnail(scope: SiteScope, sweepId: string): Promise<SweepThumbnailRecords | null> {
  const [sweep] = await readRows<Omit<SweepThumbnailRecords, "points"> & { pointCount: number | bigint }>(Prisma.sql`
    SELECT w.id, w."takenAt", w."seriesResistanceOhm", w."sourceAmplitudeV", w."pointCount" FROM "Sweep" w JOIN "Coil" ON "Coil".id = w."coilId"
    WHERE w.id = ${sweepId} AND "Coil"."siteId" = ${scope.siteId}`);
  if (!sweep) return null;
  // The points below are read by the id of the sweep just found at the scope's site, so they can only be its own.
  const { pointCount, ...head } = sweep;
  const count = rawCount(pointCount);
  if (count <= THUMBNAIL_FULL_READ_MAX) {
    const points = await readRows<{ frequencyHz: number; amplitudeV: number }>(Prisma.sql`
      SELECT "frequencyHz", "amplitudeV" FROM "SweepPoint" WHERE "sweepId" = ${sweepId} ORDER BY "frequencyHz", id`);
    return { ...head, points };
  }
  // Portable (SQLite ≥ 3.25 and PostgreSQL): a window numbering, integer division into runs, then per run its
  // frequency span and its lowest and highest reading. The run size is cast because SQLite's adapter binds a JS
  // number as a real, which would make the division fractional and every reading its own run.
  const size = Math.ceil(count / THUMBNAIL_BUCKETS);
  const runs = await readRows<{ run: number | bigint; lowHz: number; highHz: number; minV: number; maxV: number }>(Prisma.sql`
    SELECT run, min(f) AS "lowHz", max(f) AS "highHz", min(a) AS "minV", max(a) AS "maxV"
    FROM (SELECT "frequencyHz" AS f, "amplitudeV" AS a, (ROW_NUMBER() OVER (ORDER BY "frequencyHz", id) - 1) / CAST(${size} AS INTEGER) AS run
          FROM "SweepPoint" WHERE "sweepId" = ${sweepId}) AS numbered
    GROUP BY run ORDER BY run`);
  const points = runs.flatMap((r) => {
    const frequencyHz = (r.lowHz + r.highHz) / 2;
    return r.minV === r.maxV ? [{ frequencyHz, amplitudeV: r.minV }] : [{ frequencyHz, amplitudeV: r.minV }, { frequencyHz, amplitudeV: r.maxV }];
  });
  return { ...head, points };
}
