-- Existing summaries get NULL here, which readCurrentFigures (lib/db/coil-summary.ts) treats as stale: each is recomputed, with its trend, on the next dashboard view.
-- AlterTable
ALTER TABLE "CoilSummary" ADD COLUMN "headroomTrendJson" TEXT;

