-- AlterTable
ALTER TABLE "SweepResonance" ADD COLUMN     "frequencyStandardErrorHz" DOUBLE PRECISION,
ADD COLUMN     "qStandardError" DOUBLE PRECISION;


-- The voltage margin now reads the clamp's recorded voltage and the current margin a single switch's ramp
-- with a case-derated continuous rating: stored coil summaries were judged the old way, so mark them all
-- stale (the dashboard recomputes a row whose computedRevision differs from its revision).
UPDATE "CoilSummary" SET "computedRevision" = NULL;
