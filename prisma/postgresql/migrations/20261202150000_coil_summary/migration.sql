-- CreateTable
CREATE TABLE "CoilSummary" (
    "coilId" TEXT NOT NULL,
    "revision" INTEGER NOT NULL DEFAULT 0,
    "computedRevision" INTEGER,
    "policyVersion" INTEGER,
    "validUntil" TIMESTAMP(3),
    "computedAt" TIMESTAMP(3),
    "health" TEXT,
    "reasonsJson" TEXT,
    "latestMarginsJson" TEXT,
    "sessionCount" INTEGER NOT NULL DEFAULT 0,
    "totalRunS" DOUBLE PRECISION NOT NULL DEFAULT 0,
    "lastSessionAt" TIMESTAMP(3),
    "lastSweepAt" TIMESTAMP(3),

    CONSTRAINT "CoilSummary_pkey" PRIMARY KEY ("coilId")
);

-- AddForeignKey
ALTER TABLE "CoilSummary" ADD CONSTRAINT "CoilSummary_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

