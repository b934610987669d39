-- AlterTable
ALTER TABLE "SweepResonance" ADD COLUMN "frequencyStandardErrorHz" REAL;
ALTER TABLE "SweepResonance" ADD COLUMN "qStandardError" REAL;

