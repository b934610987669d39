-- Sites: every coil (and through it everything recorded about it), lending policy and audit event belongs to
-- one site, and users hold a role per site. An existing single-club database moves whole into one default site,
-- "site-main": every user keeps their role there, admins become organisation admins, the existing lending
-- policy versions become the organisation's default, and the audit trail belongs to the site.

-- CreateTable
CREATE TABLE "Site" (
    "id" TEXT NOT NULL,
    "slug" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Site_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "SiteMembership" (
    "userId" TEXT NOT NULL,
    "siteId" TEXT NOT NULL,
    "role" "Role" NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "SiteMembership_pkey" PRIMARY KEY ("userId","siteId")
);

-- The default site and everyone's role in it, read before the role column goes.
INSERT INTO "Site" ("id", "slug", "name") VALUES ('site-main', 'main', 'Main site');
INSERT INTO "SiteMembership" ("userId", "siteId", "role") SELECT "id", 'site-main', "role" FROM "User";

-- AlterTable
ALTER TABLE "User" ADD COLUMN     "organisationAdmin" BOOLEAN NOT NULL DEFAULT false;
UPDATE "User" SET "organisationAdmin" = ("role" = 'admin');
ALTER TABLE "User" DROP COLUMN "role";

-- DropIndex
DROP INDEX "Coil_tag_key";

-- AlterTable
ALTER TABLE "Coil" ADD COLUMN     "siteId" TEXT NOT NULL DEFAULT 'site-main';
ALTER TABLE "Coil" ALTER COLUMN "siteId" DROP DEFAULT;

-- AlterTable
ALTER TABLE "ClearancePolicy" ADD COLUMN     "siteId" TEXT;

-- AlterTable
ALTER TABLE "Loan" ADD COLUMN     "borrowerSiteId" TEXT;

-- AlterTable
ALTER TABLE "AuditEvent" ADD COLUMN     "siteId" TEXT;
UPDATE "AuditEvent" SET "siteId" = 'site-main';

-- CreateIndex
CREATE UNIQUE INDEX "Site_slug_key" ON "Site"("slug");

-- CreateIndex
CREATE INDEX "SiteMembership_siteId_idx" ON "SiteMembership"("siteId");

-- CreateIndex
CREATE UNIQUE INDEX "Coil_siteId_tag_key" ON "Coil"("siteId", "tag");

-- CreateIndex
CREATE INDEX "ClearancePolicy_siteId_version_idx" ON "ClearancePolicy"("siteId", "version");

-- CreateIndex
CREATE INDEX "Loan_borrowerSiteId_outAt_idx" ON "Loan"("borrowerSiteId", "outAt");

-- CreateIndex
CREATE INDEX "AuditEvent_siteId_at_idx" ON "AuditEvent"("siteId", "at");

-- AddForeignKey
ALTER TABLE "SiteMembership" ADD CONSTRAINT "SiteMembership_userId_fkey" FOREIGN KEY ("userId") REFERENCES "User"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "SiteMembership" ADD CONSTRAINT "SiteMembership_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE CASCADE ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Coil" ADD CONSTRAINT "Coil_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "ClearancePolicy" ADD CONSTRAINT "ClearancePolicy_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Loan" ADD CONSTRAINT "Loan_borrowerSiteId_fkey" FOREIGN KEY ("borrowerSiteId") REFERENCES "Site"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "AuditEvent" ADD CONSTRAINT "AuditEvent_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE SET NULL ON UPDATE CASCADE;
