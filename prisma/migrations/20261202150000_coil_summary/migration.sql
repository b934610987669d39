-- CreateTable
CREATE TABLE "CoilSummary" (
    "coilId" TEXT NOT NULL PRIMARY KEY,
    "revision" INTEGER NOT NULL DEFAULT 0,
    "computedRevision" INTEGER,
    "policyVersion" INTEGER,
    "validUntil" DATETIME,
    "computedAt" DATETIME,
    "health" TEXT,
    "reasonsJson" TEXT,
    "latestMarginsJson" TEXT,
    "sessionCount" INTEGER NOT NULL DEFAULT 0,
    "totalRunS" REAL NOT NULL DEFAULT 0,
    "lastSessionAt" DATETIME,
    "lastSweepAt" DATETIME,
    CONSTRAINT "CoilSummary_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

