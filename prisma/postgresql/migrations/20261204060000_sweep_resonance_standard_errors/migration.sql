-- AlterTable
ALTER TABLE "SweepResonance" ADD COLUMN     "frequencyStandardErrorHz" DOUBLE PRECISION,
ADD COLUMN     "qStandardError" DOUBLE PRECISION;

