/**
 * One sweep's readings for the coil page's small |Z| picture: only that sweep's points (by its (sweepId) index) and
 * the two figures |Z| is worked out with. Raw, as the coil page's other reads (lib/db/raw-read.ts says why).
 */
import { prisma } from "./client";

export interface SweepThumbnailRecords {
  id: string;
  takenAt: Date;
  seriesResistanceOhm: number;
  sourceAmplitudeV: number;
  points: { frequencyHz: number; amplitudeV: number }[];
}

export async function readSweepThumbnail(sweepId: string): Promise<SweepThumbnailRecords | null> {
  const [sweeps, points] = await Promise.all([
    prisma.$queryRaw<Omit<SweepThumbnailRecords, "points">[]>`SELECT id, "takenAt", "seriesResistanceOhm", "sourceAmplitudeV" FROM "Sweep" WHERE id = ${sweepId}`,
    prisma.$queryRaw<{ frequencyHz: number; amplitudeV: number }[]>`
      SELECT "frequencyHz", "amplitudeV" FROM "SweepPoint" WHERE "sweepId" = ${sweepId} ORDER BY "frequencyHz", id`,
  ]);
  const sweep = sweeps[0];
  return sweep ? { ...sweep, points } : null;
}
