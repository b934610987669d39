/**
 * Writes a generated demo dataset (prisma/demo/generate.ts) in one transaction: either the whole
 * demo network (its sites, people and their memberships, every site's logbook) lands or nothing does.
 * Also empties the database for `db:reset-demo`.
 */
import { prisma } from "./client";
import { markCoilChanged } from "./coil-summary";
import { fitsBySession } from "./session-fits";
import type { Prisma } from "./generated/client";
import { DEFAULT_SITE_ID } from "./site-scope";

export interface DemoDataset {
  /** The default site (DEFAULT_SITE_ID) is among them: it exists already and is renamed to the demo's first site. */
  sites: Prisma.SiteCreateManyInput[];
  users: Prisma.UserCreateManyInput[];
  memberships: Prisma.SiteMembershipCreateManyInput[];
  coils: Prisma.CoilCreateManyInput[];
  topLoads: Prisma.TopLoadCreateManyInput[];
  components: Prisma.ComponentCreateManyInput[];
  /** Replacement links, applied after every component exists. */
  componentReplacements: { id: string; replacedById: string }[];
  sweeps: Prisma.SweepCreateManyInput[];
  sweepPoints: Prisma.SweepPointCreateManyInput[];
  sweepResonances: Prisma.SweepResonanceCreateManyInput[];
  sessions: Prisma.RunSessionCreateManyInput[];
  samples: Prisma.HeatSinkSampleCreateManyInput[];
  failures: Prisma.FailureCreateManyInput[];
  policies: Prisma.ClearancePolicyCreateManyInput[];
  clearances: Prisma.ClearanceCreateManyInput[];
  loans: Prisma.LoanCreateManyInput[];
  /** Sessions run while out on loan: session id → loan id. */
  sessionLoans: { sessionId: string; loanId: string }[];
  audit: Prisma.AuditEventCreateManyInput[];
}

export function countUsersForSeed(): Promise<number> {
  return prisma.user.count();
}

const CHUNK = 2_000;

async function inChunks<T>(rows: T[], write: (chunk: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += CHUNK) await write(rows.slice(i, i + CHUNK));
}

export async function loadDemoDataset(data: DemoDataset): Promise<void> {
  await prisma.$transaction(
    async (tx) => {
      for (const site of data.sites) await tx.site.upsert({ where: { id: site.id! }, create: site, update: site });
      await tx.user.createMany({ data: data.users });
      await tx.siteMembership.createMany({ data: data.memberships });
      await tx.coil.createMany({ data: data.coils });
      await tx.topLoad.createMany({ data: data.topLoads });
      await tx.component.createMany({ data: data.components });
      for (const link of data.componentReplacements) {
        await tx.component.update({ where: { id: link.id }, data: { replacedById: link.replacedById } });
      }
      await tx.sweep.createMany({ data: data.sweeps });
      await inChunks(data.sweepPoints, (chunk) => tx.sweepPoint.createMany({ data: chunk }));
      await tx.sweepResonance.createMany({ data: data.sweepResonances });
      const fits = fitsBySession(
        data.sessions.map((session) => session.id!),
        data.samples.map((sample) => ({ ...sample, sessionId: sample.sessionId })),
      );
      await inChunks(data.sessions, (chunk) => tx.runSession.createMany({ data: chunk.map((session) => ({ ...session, ...fits.get(session.id!) })) }));
      await inChunks(data.samples, (chunk) => tx.heatSinkSample.createMany({ data: chunk }));
      await tx.failure.createMany({ data: data.failures });
      await tx.clearancePolicy.createMany({ data: data.policies });
      await tx.clearance.createMany({ data: data.clearances });
      await tx.loan.createMany({ data: data.loans });
      for (const link of data.sessionLoans) {
        await tx.runSession.update({ where: { id: link.sessionId }, data: { loanId: link.loanId } });
      }
      await tx.auditEvent.createMany({ data: data.audit });
      for (const coil of await tx.coil.findMany({ select: { id: true } })) await markCoilChanged(tx, coil.id);
    },
    { timeout: 120_000 },
  );
}

/** The default site as the sites migration creates it (prisma/migrations/20261204090000_sites). */
const DEFAULT_SITE = { id: DEFAULT_SITE_ID, slug: "main", name: "Main site" };

/** Empties every table (children first), leaving only the default site. For the demo reset and the tests. */
export async function emptyDatabase(): Promise<void> {
  await prisma.$transaction([
    prisma.auditEvent.deleteMany(),
    prisma.coilSummary.deleteMany(),
    prisma.runSession.updateMany({ data: { loanId: null } }),
    prisma.loan.deleteMany(),
    prisma.clearance.deleteMany(),
    prisma.clearancePolicy.deleteMany(),
    prisma.failure.deleteMany(),
    prisma.heatSinkSample.deleteMany(),
    prisma.runSession.deleteMany(),
    prisma.sweepResonance.deleteMany(),
    prisma.sweepPoint.deleteMany(),
    prisma.sweep.deleteMany(),
    prisma.component.updateMany({ data: { replacedById: null } }),
    prisma.component.deleteMany(),
    prisma.topLoad.deleteMany(),
    prisma.coil.deleteMany(),
    prisma.signInThrottle.deleteMany(),
    prisma.siteMembership.deleteMany(),
    prisma.user.deleteMany(),
    // Back to what a freshly migrated database holds: the one default site, as the migration named it.
    prisma.site.deleteMany({ where: { id: { not: DEFAULT_SITE_ID } } }),
    prisma.site.upsert({ where: { id: DEFAULT_SITE_ID }, create: DEFAULT_SITE, update: DEFAULT_SITE }),
  ]);
}

export async function disconnect(): Promise<void> {
  await prisma.$disconnect();
}
