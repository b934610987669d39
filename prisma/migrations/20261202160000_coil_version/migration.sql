-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_Coil" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "tag" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "builderName" TEXT NOT NULL,
    "status" TEXT NOT NULL DEFAULT 'active',
    "topology" TEXT NOT NULL DEFAULT 'single_switch',
    "formDiameterM" REAL NOT NULL,
    "windingLengthM" REAL NOT NULL,
    "turns" INTEGER NOT NULL,
    "wireDiameterM" REAL NOT NULL,
    "wireGaugeAwg" INTEGER,
    "wireMaterial" TEXT NOT NULL DEFAULT 'copper',
    "measuredDcResistanceOhm" REAL,
    "measuredInductanceH" REAL,
    "primaryTurns" REAL,
    "primaryDiameterM" REAL,
    "environmentCapacitanceF" REAL,
    "environmentCalibratedAt" DATETIME,
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL,
    "createdById" TEXT,
    "version" INTEGER NOT NULL DEFAULT 0,
    CONSTRAINT "Coil_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_Coil" ("builderName", "createdAt", "createdById", "environmentCalibratedAt", "environmentCapacitanceF", "formDiameterM", "id", "measuredDcResistanceOhm", "measuredInductanceH", "name", "notes", "primaryDiameterM", "primaryTurns", "status", "tag", "topology", "turns", "updatedAt", "windingLengthM", "wireDiameterM", "wireGaugeAwg", "wireMaterial") SELECT "builderName", "createdAt", "createdById", "environmentCalibratedAt", "environmentCapacitanceF", "formDiameterM", "id", "measuredDcResistanceOhm", "measuredInductanceH", "name", "notes", "primaryDiameterM", "primaryTurns", "status", "tag", "topology", "turns", "updatedAt", "windingLengthM", "wireDiameterM", "wireGaugeAwg", "wireMaterial" FROM "Coil";
DROP TABLE "Coil";
ALTER TABLE "new_Coil" RENAME TO "Coil";
CREATE UNIQUE INDEX "Coil_tag_key" ON "Coil"("tag");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

