-- CreateTable
CREATE TABLE "User" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "email" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "passwordHash" TEXT NOT NULL,
    "role" TEXT NOT NULL DEFAULT 'member',
    "active" BOOLEAN NOT NULL DEFAULT true,
    "lastSignInAt" DATETIME,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);

-- CreateTable
CREATE TABLE "SignInThrottle" (
    "key" TEXT NOT NULL PRIMARY KEY,
    "failures" INTEGER NOT NULL DEFAULT 0,
    "lastFailureAt" DATETIME NOT NULL,
    "lockedUntil" DATETIME
);

-- CreateTable
CREATE TABLE "Coil" (
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
    CONSTRAINT "Coil_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "TopLoad" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "shape" TEXT NOT NULL,
    "diameterM" REAL,
    "tubeDiameterM" REAL,
    "heightM" REAL,
    "measuredCapacitanceF" REAL,
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "retiredAt" DATETIME,
    CONSTRAINT "TopLoad_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Component" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "partNumber" TEXT NOT NULL,
    "manufacturer" TEXT NOT NULL DEFAULT '',
    "description" TEXT NOT NULL DEFAULT '',
    "serial" TEXT NOT NULL DEFAULT '',
    "switchType" TEXT,
    "voltageRatingV" REAL,
    "continuousCurrentA" REAL,
    "peakCurrentA" REAL,
    "powerRating25CW" REAL,
    "maxJunctionTempC" REAL,
    "thermalResistanceJcKPerW" REAL,
    "caseToSinkKPerW" REAL,
    "sinkThermalResistanceKPerW" REAL,
    "sinkMassKg" REAL,
    "resistanceOhm" REAL,
    "capacitanceF" REAL,
    "clampVoltageV" REAL,
    "installedAt" DATETIME NOT NULL,
    "removedAt" DATETIME,
    "removalReason" TEXT,
    "replacedById" TEXT,
    CONSTRAINT "Component_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Component_replacedById_fkey" FOREIGN KEY ("replacedById") REFERENCES "Component" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Sweep" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "topLoadId" TEXT,
    "takenAt" DATETIME NOT NULL,
    "takenById" TEXT,
    "seriesResistanceOhm" REAL NOT NULL,
    "sourceAmplitudeV" REAL NOT NULL,
    "amplitudeConvention" TEXT NOT NULL DEFAULT 'peak_to_peak',
    "environmentNotes" TEXT NOT NULL DEFAULT '',
    "notes" TEXT NOT NULL DEFAULT '',
    "pointCount" INTEGER NOT NULL DEFAULT 0,
    "firstSeriesResonanceHz" REAL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Sweep_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Sweep_topLoadId_fkey" FOREIGN KEY ("topLoadId") REFERENCES "TopLoad" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Sweep_takenById_fkey" FOREIGN KEY ("takenById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "SweepPoint" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "sweepId" TEXT NOT NULL,
    "frequencyHz" REAL NOT NULL,
    "amplitudeV" REAL NOT NULL,
    CONSTRAINT "SweepPoint_sweepId_fkey" FOREIGN KEY ("sweepId") REFERENCES "Sweep" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "SweepResonance" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "sweepId" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "ordinal" INTEGER NOT NULL,
    "frequencyHz" REAL NOT NULL,
    "impedanceOhm" REAL NOT NULL,
    "q" REAL,
    CONSTRAINT "SweepResonance_sweepId_fkey" FOREIGN KEY ("sweepId") REFERENCES "Sweep" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "RunSession" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "topLoadId" TEXT,
    "startedAt" DATETIME NOT NULL,
    "loggedById" TEXT,
    "supplyVoltageV" REAL NOT NULL,
    "supplyCurrentA" REAL NOT NULL,
    "durationS" REAL NOT NULL,
    "ambientTempC" REAL NOT NULL,
    "heatSinkStartC" REAL,
    "heatSinkEndC" REAL,
    "runningFrequencyHz" REAL,
    "peakSwitchVoltageV" REAL,
    "dutyCycle" REAL,
    "outcome" TEXT NOT NULL DEFAULT 'normal',
    "notes" TEXT NOT NULL DEFAULT '',
    "loanId" TEXT,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "RunSession_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "RunSession_topLoadId_fkey" FOREIGN KEY ("topLoadId") REFERENCES "TopLoad" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "RunSession_loggedById_fkey" FOREIGN KEY ("loggedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "RunSession_loanId_fkey" FOREIGN KEY ("loanId") REFERENCES "Loan" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "HeatSinkSample" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "sessionId" TEXT NOT NULL,
    "elapsedS" REAL NOT NULL,
    "temperatureC" REAL NOT NULL,
    CONSTRAINT "HeatSinkSample_sessionId_fkey" FOREIGN KEY ("sessionId") REFERENCES "RunSession" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Failure" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "sessionId" TEXT,
    "componentId" TEXT,
    "occurredAt" DATETIME NOT NULL,
    "mode" TEXT NOT NULL,
    "symptoms" TEXT NOT NULL,
    "rootCause" TEXT,
    "correctiveAction" TEXT,
    "status" TEXT NOT NULL DEFAULT 'open',
    "replacementComponentId" TEXT,
    "reportedById" TEXT,
    "closedById" TEXT,
    "closedAt" DATETIME,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Failure_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Failure_sessionId_fkey" FOREIGN KEY ("sessionId") REFERENCES "RunSession" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Failure_componentId_fkey" FOREIGN KEY ("componentId") REFERENCES "Component" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Failure_replacementComponentId_fkey" FOREIGN KEY ("replacementComponentId") REFERENCES "Component" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Failure_reportedById_fkey" FOREIGN KEY ("reportedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Failure_closedById_fkey" FOREIGN KEY ("closedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "ClearancePolicy" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "version" INTEGER NOT NULL,
    "rulesJson" TEXT NOT NULL,
    "note" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "createdById" TEXT,
    CONSTRAINT "ClearancePolicy_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Clearance" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "policyId" TEXT NOT NULL,
    "decidedById" TEXT,
    "decidedAt" DATETIME NOT NULL,
    "validUntil" DATETIME NOT NULL,
    "verdict" TEXT NOT NULL,
    "ruleResultsJson" TEXT NOT NULL,
    "checklistJson" TEXT NOT NULL,
    "maxSupplyVoltageV" REAL,
    "maxRunS" REAL,
    "conditions" TEXT NOT NULL DEFAULT '',
    "lapsedAt" DATETIME,
    "lapseReason" TEXT,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Clearance_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Clearance_policyId_fkey" FOREIGN KEY ("policyId") REFERENCES "ClearancePolicy" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Clearance_decidedById_fkey" FOREIGN KEY ("decidedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Loan" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "coilId" TEXT NOT NULL,
    "clearanceId" TEXT NOT NULL,
    "borrower" TEXT NOT NULL,
    "borrowerContact" TEXT NOT NULL DEFAULT '',
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
    CONSTRAINT "Loan_lentById_fkey" FOREIGN KEY ("lentById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Loan_receivedById_fkey" FOREIGN KEY ("receivedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "AuditEvent" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "at" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "actorId" TEXT,
    "action" TEXT NOT NULL,
    "entity" TEXT NOT NULL,
    "entityId" TEXT NOT NULL,
    "summary" TEXT NOT NULL,
    "detailJson" TEXT,
    CONSTRAINT "AuditEvent_actorId_fkey" FOREIGN KEY ("actorId") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateIndex
CREATE UNIQUE INDEX "User_email_key" ON "User"("email");

-- CreateIndex
CREATE UNIQUE INDEX "Coil_tag_key" ON "Coil"("tag");

-- CreateIndex
CREATE INDEX "TopLoad_coilId_idx" ON "TopLoad"("coilId");

-- CreateIndex
CREATE UNIQUE INDEX "Component_replacedById_key" ON "Component"("replacedById");

-- CreateIndex
CREATE INDEX "Component_coilId_kind_idx" ON "Component"("coilId", "kind");

-- CreateIndex
CREATE INDEX "Component_partNumber_idx" ON "Component"("partNumber");

-- CreateIndex
CREATE INDEX "Sweep_coilId_takenAt_idx" ON "Sweep"("coilId", "takenAt");

-- CreateIndex
CREATE INDEX "SweepPoint_sweepId_frequencyHz_idx" ON "SweepPoint"("sweepId", "frequencyHz");

-- CreateIndex
CREATE INDEX "SweepResonance_sweepId_idx" ON "SweepResonance"("sweepId");

-- CreateIndex
CREATE INDEX "RunSession_coilId_startedAt_idx" ON "RunSession"("coilId", "startedAt");

-- CreateIndex
CREATE INDEX "RunSession_startedAt_idx" ON "RunSession"("startedAt");

-- CreateIndex
CREATE INDEX "HeatSinkSample_sessionId_elapsedS_idx" ON "HeatSinkSample"("sessionId", "elapsedS");

-- CreateIndex
CREATE INDEX "Failure_coilId_occurredAt_idx" ON "Failure"("coilId", "occurredAt");

-- CreateIndex
CREATE INDEX "Failure_status_idx" ON "Failure"("status");

-- CreateIndex
CREATE UNIQUE INDEX "ClearancePolicy_version_key" ON "ClearancePolicy"("version");

-- CreateIndex
CREATE INDEX "Clearance_coilId_decidedAt_idx" ON "Clearance"("coilId", "decidedAt");

-- CreateIndex
CREATE INDEX "Loan_coilId_outAt_idx" ON "Loan"("coilId", "outAt");

-- CreateIndex
CREATE INDEX "Loan_returnedAt_idx" ON "Loan"("returnedAt");

-- CreateIndex
CREATE INDEX "AuditEvent_entity_entityId_idx" ON "AuditEvent"("entity", "entityId");

-- CreateIndex
CREATE INDEX "AuditEvent_at_idx" ON "AuditEvent"("at");

