-- A policy row kept only as the record of an imported clearance's rules is never a current policy.
-- AlterTable
ALTER TABLE "ClearancePolicy" ADD COLUMN     "recordOnly" BOOLEAN NOT NULL DEFAULT false;

