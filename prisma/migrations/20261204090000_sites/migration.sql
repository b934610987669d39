-- Sites: every coil (and through it everything recorded about it), lending policy and audit event belongs to
-- one site; users hold a role per site. An existing single-club database moves whole into one default site,
-- "site-main": every user keeps their role there, admins become organisation admins, the existing lending
-- policy versions become the organisation's default, and the audit trail belongs to the site.
-- CreateTable
CREATE TABLE "Site" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "slug" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP
);

-- CreateTable
CREATE TABLE "SiteMembership" (
    "userId" TEXT NOT NULL,
    "siteId" TEXT NOT NULL,
    "role" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,

    PRIMARY KEY ("userId", "siteId"),
    CONSTRAINT "SiteMembership_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "SiteMembership_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- The default site and everyone's role in it, read before the role column goes.
INSERT INTO "Site" ("id", "slug", "name") VALUES ('site-main', 'main', 'Main site');
INSERT INTO "SiteMembership" ("userId", "siteId", "role") SELECT "id", 'site-main', "role" FROM "User";

-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_User" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "email" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "passwordHash" TEXT NOT NULL,
    "organisationAdmin" BOOLEAN NOT NULL DEFAULT false,
    "active" BOOLEAN NOT NULL DEFAULT true,
    "lastSignInAt" DATETIME,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
INSERT INTO "new_User" ("active", "createdAt", "email", "id", "lastSignInAt", "name", "passwordHash", "updatedAt", "organisationAdmin") SELECT "active", "createdAt", "email", "id", "lastSignInAt", "name", "passwordHash", "updatedAt", "role" = 'admin' FROM "User";
DROP TABLE "User";
ALTER TABLE "new_User" RENAME TO "User";
CREATE UNIQUE INDEX "User_email_key" ON "User"("email");
CREATE TABLE "new_Coil" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "siteId" TEXT NOT NULL,
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
    "planJson" TEXT,
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL,
    "createdById" TEXT,
    "version" INTEGER NOT NULL DEFAULT 0,
    CONSTRAINT "Coil_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Coil_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_Coil" ("builderName", "createdAt", "createdById", "environmentCalibratedAt", "environmentCapacitanceF", "formDiameterM", "id", "measuredDcResistanceOhm", "measuredInductanceH", "name", "notes", "planJson", "primaryDiameterM", "primaryTurns", "status", "tag", "topology", "turns", "updatedAt", "version", "windingLengthM", "wireDiameterM", "wireGaugeAwg", "wireMaterial", "siteId") SELECT "builderName", "createdAt", "createdById", "environmentCalibratedAt", "environmentCapacitanceF", "formDiameterM", "id", "measuredDcResistanceOhm", "measuredInductanceH", "name", "notes", "planJson", "primaryDiameterM", "primaryTurns", "status", "tag", "topology", "turns", "updatedAt", "version", "windingLengthM", "wireDiameterM", "wireGaugeAwg", "wireMaterial", 'site-main' FROM "Coil";
DROP TABLE "Coil";
ALTER TABLE "new_Coil" RENAME TO "Coil";
CREATE UNIQUE INDEX "Coil_siteId_tag_key" ON "Coil"("siteId", "tag");
CREATE TABLE "new_ClearancePolicy" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "siteId" TEXT,
    "version" INTEGER NOT NULL,
    "rulesJson" TEXT NOT NULL,
    "note" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "createdById" TEXT,
    CONSTRAINT "ClearancePolicy_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "ClearancePolicy_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_ClearancePolicy" ("createdAt", "createdById", "id", "note", "rulesJson", "version") SELECT "createdAt", "createdById", "id", "note", "rulesJson", "version" FROM "ClearancePolicy";
DROP TABLE "ClearancePolicy";
ALTER TABLE "new_ClearancePolicy" RENAME TO "ClearancePolicy";
CREATE UNIQUE INDEX "ClearancePolicy_version_key" ON "ClearancePolicy"("version");
CREATE INDEX "ClearancePolicy_siteId_version_idx" ON "ClearancePolicy"("siteId", "version");
CREATE TABLE "new_Loan" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "clearanceId" TEXT NOT NULL,
    "borrower" TEXT NOT NULL,
    "borrowerContact" TEXT NOT NULL DEFAULT '',
    "borrowerSiteId" TEXT,
    "event" TEXT NOT NULL,
    "outAt" DATETIME NOT NULL,
    "expectedBackAt" DATETIME NOT NULL,
    "returnedAt" DATETIME,
    "returnCondition" TEXT,
    "returnNotes" TEXT,
    "lentById" TEXT,
    "receivedById" TEXT,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Loan_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Loan_clearanceId_fkey" FOREIGN KEY ("clearanceId") REFERENCES "Clearance" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Loan_borrowerSiteId_fkey" FOREIGN KEY ("borrowerSiteId") REFERENCES "Site" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Loan_lentById_fkey" FOREIGN KEY ("lentById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Loan_receivedById_fkey" FOREIGN KEY ("receivedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_Loan" ("borrower", "borrowerContact", "clearanceId", "coilId", "createdAt", "event", "expectedBackAt", "id", "lentById", "outAt", "receivedById", "returnCondition", "returnNotes", "returnedAt") SELECT "borrower", "borrowerContact", "clearanceId", "coilId", "createdAt", "event", "expectedBackAt", "id", "lentById", "outAt", "receivedById", "returnCondition", "returnNotes", "returnedAt" FROM "Loan";
DROP TABLE "Loan";
ALTER TABLE "new_Loan" RENAME TO "Loan";
CREATE INDEX "Loan_coilId_outAt_idx" ON "Loan"("coilId", "outAt");
CREATE INDEX "Loan_returnedAt_idx" ON "Loan"("returnedAt");
CREATE INDEX "Loan_borrowerSiteId_outAt_idx" ON "Loan"("borrowerSiteId", "outAt");
CREATE TABLE "new_AuditEvent" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" TEXT,
    "at" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "actorId" TEXT,
    "action" TEXT NOT NULL,
    "entity" TEXT NOT NULL,
    "entityId" TEXT NOT NULL,
    "summary" TEXT NOT NULL,
    "detailJson" TEXT,
    CONSTRAINT "AuditEvent_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "AuditEvent_actorId_fkey" FOREIGN KEY ("actorId") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_AuditEvent" ("action", "actorId", "at", "detailJson", "entity", "entityId", "id", "summary", "siteId") SELECT "action", "actorId", "at", "detailJson", "entity", "entityId", "id", "summary", 'site-main' FROM "AuditEvent";
DROP TABLE "AuditEvent";
ALTER TABLE "new_AuditEvent" RENAME TO "AuditEvent";
CREATE INDEX "AuditEvent_entity_entityId_idx" ON "AuditEvent"("entity", "entityId");
CREATE INDEX "AuditEvent_at_idx" ON "AuditEvent"("at");
CREATE INDEX "AuditEvent_siteId_at_idx" ON "AuditEvent"("siteId", "at");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

-- CreateIndex
CREATE UNIQUE INDEX "Site_slug_key" ON "Site"("slug");

-- CreateIndex
CREATE INDEX "SiteMembership_siteId_idx" ON "SiteMembership"("siteId");

