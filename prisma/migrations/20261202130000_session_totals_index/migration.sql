-- DropIndex
DROP INDEX "RunSession_coilId_startedAt_idx";

-- CreateIndex
CREATE INDEX "RunSession_coilId_startedAt_durationS_idx" ON "RunSession"("coilId", "startedAt", "durationS");

