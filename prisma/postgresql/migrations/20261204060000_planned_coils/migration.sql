-- AlterEnum
ALTER TYPE "CoilStatus" ADD VALUE 'planned';

-- AlterTable
ALTER TABLE "Coil" ADD COLUMN     "planJson" TEXT;

