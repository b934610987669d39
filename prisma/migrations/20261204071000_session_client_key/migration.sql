-- AlterTable
ALTER TABLE "RunSession" ADD COLUMN "clientKey" TEXT;

-- CreateIndex
CREATE UNIQUE INDEX "RunSession_clientKey_key" ON "RunSession"("clientKey");

