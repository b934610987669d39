-- AlterTable
ALTER TABLE "Coil" ADD COLUMN "planJson" TEXT;

