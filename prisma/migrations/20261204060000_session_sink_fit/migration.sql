-- AlterTable
ALTER TABLE "RunSession" ADD COLUMN "sinkFitExtrapolation" TEXT;
ALTER TABLE "RunSession" ADD COLUMN "sinkFitJson" TEXT;
ALTER TABLE "RunSession" ADD COLUMN "sinkFitSampleCount" INTEGER;
ALTER TABLE "RunSession" ADD COLUMN "sinkSteadyStateC" REAL;
ALTER TABLE "RunSession" ADD COLUMN "sinkSteadyStateSeK" REAL;
ALTER TABLE "RunSession" ADD COLUMN "sinkTimeConstantS" REAL;


-- The thermal margin now judges a run by where its warm-up was heading and every margin's status by the current
-- policy's thresholds (health's own 0.1 thermal threshold is gone): stored summaries were computed under the old
-- meaning, so mark them all stale; the next dashboard read recomputes them (lib/db/coil-summary.ts).
UPDATE "CoilSummary" SET "computedRevision" = NULL;
