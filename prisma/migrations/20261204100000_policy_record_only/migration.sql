-- A policy row kept only as the record of an imported clearance's rules is never a current policy.
-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_ClearancePolicy" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "siteId" TEXT,
    "version" INTEGER NOT NULL,
    "recordOnly" BOOLEAN NOT NULL DEFAULT false,
    "rulesJson" TEXT NOT NULL,
    "note" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "createdById" TEXT,
    CONSTRAINT "ClearancePolicy_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "ClearancePolicy_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_ClearancePolicy" ("createdAt", "createdById", "id", "note", "rulesJson", "siteId", "version") SELECT "createdAt", "createdById", "id", "note", "rulesJson", "siteId", "version" FROM "ClearancePolicy";
DROP TABLE "ClearancePolicy";
ALTER TABLE "new_ClearancePolicy" RENAME TO "ClearancePolicy";
CREATE UNIQUE INDEX "ClearancePolicy_version_key" ON "ClearancePolicy"("version");
CREATE INDEX "ClearancePolicy_siteId_version_idx" ON "ClearancePolicy"("siteId", "version");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

