-- CreateSchema
CREATE SCHEMA IF NOT EXISTS "public";

-- CreateEnum
CREATE TYPE "Role" AS ENUM ('member', 'steward', 'admin');

-- CreateEnum
CREATE TYPE "CoilStatus" AS ENUM ('active', 'repair', 'retired');

-- CreateEnum
CREATE TYPE "DriverTopology" AS ENUM ('single_switch', 'push_pull', 'half_bridge', 'full_bridge');

-- CreateEnum
CREATE TYPE "WireMaterial" AS ENUM ('copper', 'aluminium');

-- CreateEnum
CREATE TYPE "TopLoadShape" AS ENUM ('none', 'sphere', 'disc', 'toroid', 'cylinder', 'measured');

-- CreateEnum
CREATE TYPE "ComponentKind" AS ENUM ('switch', 'heat_sink', 'snubber', 'clamp', 'fan', 'gate_drive', 'other');

-- CreateEnum
CREATE TYPE "SwitchType" AS ENUM ('bjt', 'mosfet', 'igbt');

-- CreateEnum
CREATE TYPE "AmplitudeConvention" AS ENUM ('peak_to_peak', 'peak', 'rms');

-- CreateEnum
CREATE TYPE "ResonanceKind" AS ENUM ('series', 'parallel');

-- CreateEnum
CREATE TYPE "SessionOutcome" AS ENUM ('normal', 'stopped', 'anomaly', 'failed');

-- CreateEnum
CREATE TYPE "FailureMode" AS ENUM ('over_voltage', 'over_current', 'over_temperature', 'reverse_base_breakdown', 'mechanical', 'unknown');

-- CreateEnum
CREATE TYPE "FailureStatus" AS ENUM ('open', 'closed');

-- CreateEnum
CREATE TYPE "ClearanceVerdict" AS ENUM ('cleared', 'refused');

-- CreateTable
CREATE TABLE "User" (
    "id" TEXT NOT NULL,
    "email" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "passwordHash" TEXT NOT NULL,
    "role" "Role" NOT NULL DEFAULT 'member',
    "active" BOOLEAN NOT NULL DEFAULT true,
    "lastSignInAt" TIMESTAMP(3),
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,

    CONSTRAINT "User_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "SignInThrottle" (
    "key" TEXT NOT NULL,
    "failures" INTEGER NOT NULL DEFAULT 0,
    "lastFailureAt" TIMESTAMP(3) NOT NULL,
    "lockedUntil" TIMESTAMP(3),

    CONSTRAINT "SignInThrottle_pkey" PRIMARY KEY ("key")
);

-- CreateTable
CREATE TABLE "Coil" (
    "id" TEXT NOT NULL,
    "tag" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "builderName" TEXT NOT NULL,
    "status" "CoilStatus" NOT NULL DEFAULT 'active',
    "topology" "DriverTopology" NOT NULL DEFAULT 'single_switch',
    "formDiameterM" DOUBLE PRECISION NOT NULL,
    "windingLengthM" DOUBLE PRECISION NOT NULL,
    "turns" INTEGER NOT NULL,
    "wireDiameterM" DOUBLE PRECISION NOT NULL,
    "wireGaugeAwg" INTEGER,
    "wireMaterial" "WireMaterial" NOT NULL DEFAULT 'copper',
    "measuredDcResistanceOhm" DOUBLE PRECISION,
    "measuredInductanceH" DOUBLE PRECISION,
    "primaryTurns" DOUBLE PRECISION,
    "primaryDiameterM" DOUBLE PRECISION,
    "environmentCapacitanceF" DOUBLE PRECISION,
    "environmentCalibratedAt" TIMESTAMP(3),
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    "createdById" TEXT,

    CONSTRAINT "Coil_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "TopLoad" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "shape" "TopLoadShape" NOT NULL,
    "diameterM" DOUBLE PRECISION,
    "tubeDiameterM" DOUBLE PRECISION,
    "heightM" DOUBLE PRECISION,
    "measuredCapacitanceF" DOUBLE PRECISION,
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "retiredAt" TIMESTAMP(3),

    CONSTRAINT "TopLoad_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "Component" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "kind" "ComponentKind" NOT NULL,
    "partNumber" TEXT NOT NULL,
    "manufacturer" TEXT NOT NULL DEFAULT '',
    "description" TEXT NOT NULL DEFAULT '',
    "serial" TEXT NOT NULL DEFAULT '',
    "switchType" "SwitchType",
    "voltageRatingV" DOUBLE PRECISION,
    "continuousCurrentA" DOUBLE PRECISION,
    "peakCurrentA" DOUBLE PRECISION,
    "powerRating25CW" DOUBLE PRECISION,
    "maxJunctionTempC" DOUBLE PRECISION,
    "thermalResistanceJcKPerW" DOUBLE PRECISION,
    "caseToSinkKPerW" DOUBLE PRECISION,
    "sinkThermalResistanceKPerW" DOUBLE PRECISION,
    "sinkMassKg" DOUBLE PRECISION,
    "resistanceOhm" DOUBLE PRECISION,
    "capacitanceF" DOUBLE PRECISION,
    "clampVoltageV" DOUBLE PRECISION,
    "installedAt" TIMESTAMP(3) NOT NULL,
    "removedAt" TIMESTAMP(3),
    "removalReason" TEXT,
    "replacedById" TEXT,

    CONSTRAINT "Component_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "Sweep" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "topLoadId" TEXT,
    "takenAt" TIMESTAMP(3) NOT NULL,
    "takenById" TEXT,
    "seriesResistanceOhm" DOUBLE PRECISION NOT NULL,
    "sourceAmplitudeV" DOUBLE PRECISION NOT NULL,
    "amplitudeConvention" "AmplitudeConvention" NOT NULL DEFAULT 'peak_to_peak',
    "environmentNotes" TEXT NOT NULL DEFAULT '',
    "notes" TEXT NOT NULL DEFAULT '',
    "pointCount" INTEGER NOT NULL DEFAULT 0,
    "firstSeriesResonanceHz" DOUBLE PRECISION,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Sweep_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "SweepPoint" (
    "id" SERIAL NOT NULL,
    "sweepId" TEXT NOT NULL,
    "frequencyHz" DOUBLE PRECISION NOT NULL,
    "amplitudeV" DOUBLE PRECISION NOT NULL,

    CONSTRAINT "SweepPoint_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "SweepResonance" (
    "id" TEXT NOT NULL,
    "sweepId" TEXT NOT NULL,
    "kind" "ResonanceKind" NOT NULL,
    "ordinal" INTEGER NOT NULL,
    "frequencyHz" DOUBLE PRECISION NOT NULL,
    "impedanceOhm" DOUBLE PRECISION NOT NULL,
    "q" DOUBLE PRECISION,

    CONSTRAINT "SweepResonance_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "RunSession" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "topLoadId" TEXT,
    "startedAt" TIMESTAMP(3) NOT NULL,
    "loggedById" TEXT,
    "supplyVoltageV" DOUBLE PRECISION NOT NULL,
    "supplyCurrentA" DOUBLE PRECISION NOT NULL,
    "durationS" DOUBLE PRECISION NOT NULL,
    "ambientTempC" DOUBLE PRECISION NOT NULL,
    "heatSinkStartC" DOUBLE PRECISION,
    "heatSinkEndC" DOUBLE PRECISION,
    "runningFrequencyHz" DOUBLE PRECISION,
    "peakSwitchVoltageV" DOUBLE PRECISION,
    "dutyCycle" DOUBLE PRECISION,
    "outcome" "SessionOutcome" NOT NULL DEFAULT 'normal',
    "notes" TEXT NOT NULL DEFAULT '',
    "loanId" TEXT,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "RunSession_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "HeatSinkSample" (
    "id" SERIAL NOT NULL,
    "sessionId" TEXT NOT NULL,
    "elapsedS" DOUBLE PRECISION NOT NULL,
    "temperatureC" DOUBLE PRECISION NOT NULL,

    CONSTRAINT "HeatSinkSample_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "Failure" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "sessionId" TEXT,
    "componentId" TEXT,
    "occurredAt" TIMESTAMP(3) NOT NULL,
    "mode" "FailureMode" NOT NULL,
    "symptoms" TEXT NOT NULL,
    "rootCause" TEXT,
    "correctiveAction" TEXT,
    "status" "FailureStatus" NOT NULL DEFAULT 'open',
    "replacementComponentId" TEXT,
    "reportedById" TEXT,
    "closedById" TEXT,
    "closedAt" TIMESTAMP(3),
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Failure_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "ClearancePolicy" (
    "id" TEXT NOT NULL,
    "version" INTEGER NOT NULL,
    "rulesJson" TEXT NOT NULL,
    "note" TEXT NOT NULL DEFAULT '',
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "createdById" TEXT,

    CONSTRAINT "ClearancePolicy_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "Clearance" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "policyId" TEXT NOT NULL,
    "decidedById" TEXT,
    "decidedAt" TIMESTAMP(3) NOT NULL,
    "validUntil" TIMESTAMP(3) NOT NULL,
    "verdict" "ClearanceVerdict" NOT NULL,
    "ruleResultsJson" TEXT NOT NULL,
    "checklistJson" TEXT NOT NULL,
    "maxSupplyVoltageV" DOUBLE PRECISION,
    "maxRunS" DOUBLE PRECISION,
    "conditions" TEXT NOT NULL DEFAULT '',
    "lapsedAt" TIMESTAMP(3),
    "lapseReason" TEXT,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Clearance_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "Loan" (
    "id" TEXT NOT NULL,
    "coilId" TEXT NOT NULL,
    "clearanceId" TEXT NOT NULL,
    "borrower" TEXT NOT NULL,
    "borrowerContact" TEXT NOT NULL DEFAULT '',
    "event" TEXT NOT NULL,
    "outAt" TIMESTAMP(3) NOT NULL,
    "expectedBackAt" TIMESTAMP(3) NOT NULL,
    "returnedAt" TIMESTAMP(3),
    "returnCondition" TEXT,
    "returnNotes" TEXT,
    "lentById" TEXT,
    "receivedById" TEXT,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Loan_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "AuditEvent" (
    "id" SERIAL NOT NULL,
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "actorId" TEXT,
    "action" TEXT NOT NULL,
    "entity" TEXT NOT NULL,
    "entityId" TEXT NOT NULL,
    "summary" TEXT NOT NULL,
    "detailJson" TEXT,

    CONSTRAINT "AuditEvent_pkey" PRIMARY KEY ("id")
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
CREATE INDEX "RunSession_coilId_startedAt_durationS_idx" ON "RunSession"("coilId", "startedAt", "durationS");

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

-- AddForeignKey
ALTER TABLE "Coil" ADD CONSTRAINT "Coil_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "TopLoad" ADD CONSTRAINT "TopLoad_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Component" ADD CONSTRAINT "Component_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Component" ADD CONSTRAINT "Component_replacedById_fkey" FOREIGN KEY ("replacedById") REFERENCES "Component"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Sweep" ADD CONSTRAINT "Sweep_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Sweep" ADD CONSTRAINT "Sweep_topLoadId_fkey" FOREIGN KEY ("topLoadId") REFERENCES "TopLoad"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Sweep" ADD CONSTRAINT "Sweep_takenById_fkey" FOREIGN KEY ("takenById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "SweepPoint" ADD CONSTRAINT "SweepPoint_sweepId_fkey" FOREIGN KEY ("sweepId") REFERENCES "Sweep"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "SweepResonance" ADD CONSTRAINT "SweepResonance_sweepId_fkey" FOREIGN KEY ("sweepId") REFERENCES "Sweep"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "RunSession" ADD CONSTRAINT "RunSession_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "RunSession" ADD CONSTRAINT "RunSession_topLoadId_fkey" FOREIGN KEY ("topLoadId") REFERENCES "TopLoad"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "RunSession" ADD CONSTRAINT "RunSession_loggedById_fkey" FOREIGN KEY ("loggedById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "RunSession" ADD CONSTRAINT "RunSession_loanId_fkey" FOREIGN KEY ("loanId") REFERENCES "Loan"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "HeatSinkSample" ADD CONSTRAINT "HeatSinkSample_sessionId_fkey" FOREIGN KEY ("sessionId") REFERENCES "RunSession"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_sessionId_fkey" FOREIGN KEY ("sessionId") REFERENCES "RunSession"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_componentId_fkey" FOREIGN KEY ("componentId") REFERENCES "Component"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_replacementComponentId_fkey" FOREIGN KEY ("replacementComponentId") REFERENCES "Component"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_reportedById_fkey" FOREIGN KEY ("reportedById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Failure" ADD CONSTRAINT "Failure_closedById_fkey" FOREIGN KEY ("closedById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "ClearancePolicy" ADD CONSTRAINT "ClearancePolicy_createdById_fkey" FOREIGN KEY ("createdById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Clearance" ADD CONSTRAINT "Clearance_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Clearance" ADD CONSTRAINT "Clearance_policyId_fkey" FOREIGN KEY ("policyId") REFERENCES "ClearancePolicy"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Clearance" ADD CONSTRAINT "Clearance_decidedById_fkey" FOREIGN KEY ("decidedById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Loan" ADD CONSTRAINT "Loan_coilId_fkey" FOREIGN KEY ("coilId") REFERENCES "Coil"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Loan" ADD CONSTRAINT "Loan_clearanceId_fkey" FOREIGN KEY ("clearanceId") REFERENCES "Clearance"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Loan" ADD CONSTRAINT "Loan_lentById_fkey" FOREIGN KEY ("lentById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Loan" ADD CONSTRAINT "Loan_receivedById_fkey" FOREIGN KEY ("receivedById") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "AuditEvent" ADD CONSTRAINT "AuditEvent_actorId_fkey" FOREIGN KEY ("actorId") REFERENCES "User"("id") ON DELETE SET NULL ON UPDATE CASCADE;

