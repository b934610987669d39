-- AlterTable
ALTER TABLE "RunSession" ADD COLUMN "sinkFitExtrapolation" TEXT;
ALTER TABLE "RunSession" ADD COLUMN "sinkFitJson" TEXT;
ALTER TABLE "RunSession" ADD COLUMN "sinkFitSampleCount" INTEGER;
ALTER TABLE "RunSession" ADD COLUMN "sinkSteadyStateC" REAL;
ALTER TABLE "RunSession" ADD COLUMN "sinkSteadyStateSeK" REAL;
ALTER TABLE "RunSession" ADD COLUMN "sinkTimeConstantS" REAL;


-- The thermal margin now judges a run by where its warm-up was heading, and every margin status by the current
-- lending policy thresholds (the separate 0.1 thermal threshold of the health check is gone). Stored summaries were
-- computed under the old meaning, so mark them all stale: the next dashboard read recomputes them
-- (lib/db/coil-summary.ts). No semicolons or quote characters in these comments: the runner splits statements on them.
UPDATE "CoilSummary" SET "computedRevision" = NULL;
