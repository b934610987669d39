/**
 * Sites for the isolation tests: several sites on one database, each holding its own copy of part of the demo
 * club (every kind of record: coils, top loads, parts and their replacements, sweeps with points and resonances,
 * sessions with heat-sink samples, failures, clearances, loans), re-keyed so every id names the site it belongs
 * to. A test can then look at any answer and say, from the ids in it, which site each record came from.
 *
 * The rows are written with Prisma directly (as the demo loader does) rather than through lib/db, so the
 * fixture does not depend on the functions whose isolation it is there to test.
 */
import { hashPassword } from "../../lib/auth/password";
import type { Role } from "../../lib/auth/roles";
import { fitsBySession } from "../../lib/db/session-fits";
import { markCoilChanged } from "../../lib/db/coil-summary";
import { Prisma } from "../../lib/db/generated/client";
import { generateDemoDataset } from "../../prisma/demo/generate";
import { DEMO_PEOPLE } from "../../prisma/demo/people";
import { resetDatabase, testDb } from "./db";

/** The record tables copied into a site, in the order they can be written. */
const RECORD_TABLES = ["coils", "topLoads", "components", "sweeps", "sweepPoints", "sweepResonances", "sessions", "samples", "failures", "clearances", "loans"] as const;
type RecordTable = (typeof RECORD_TABLES)[number];
type Row = Record<string, unknown>;

export type SiteRows = Record<RecordTable, Row[]> & {
  componentReplacements: { id: string; replacedById: string }[];
  sessionLoans: { sessionId: string; loanId: string }[];
};

let pool: { rows: SiteRows; policies: Row[]; users: Row[] } | undefined;

/**
 * The demo club, generated once with today's date as its anchor (as the seed does), so clearances and loans are
 * current: a copy's cleared coil can really be lent, its loan out really returned.
 */
function demoPool() {
  if (pool) return pool;
  const today = new Date();
  const anchor = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate()));
  const hashes = Object.fromEntries(DEMO_PEOPLE.map((person) => [person.key, "not-a-sign-in-hash"]));
  const dataset = generateDemoDataset({ anchor, passwordHashes: hashes as never }) as unknown as Record<string, Row[]>;
  const rows = Object.fromEntries(RECORD_TABLES.map((table) => [table, dataset[table] ?? []])) as SiteRows;
  rows.componentReplacements = (dataset.componentReplacements ?? []) as SiteRows["componentReplacements"];
  rows.sessionLoans = (dataset.sessionLoans ?? []) as SiteRows["sessionLoans"];
  pool = { rows, policies: (dataset.policies ?? []).filter((p) => !p.siteId), users: dataset.users ?? [] };
  return pool;
}

/** Tags of the demo coils a site gets by default: two with a failure, one with a returned loan and two clearances, one out on loan. */
export const SITE_COPY_TAGS = ["KM-01", "KM-02", "KM-03", "KM-05"] as const;

export interface SiteCopyOptions {
  siteId: string;
  /** Put before every id of the copy; also how a test recognises the site's records ("sa~", "sb~"). */
  idPrefix: string;
  /** Put before every coil tag (empty: the demo's own tags, so two sites share tags). */
  tagPrefix?: string;
  tags?: readonly string[];
  /** Demo user ids → this site's users, for the "who" columns (logged by, decided by …); others become null. */
  people?: Readonly<Record<string, string>>;
  /** Keep only the first 40 points of each sweep and 4 samples of each session, so a site loads in a moment. */
  thin?: boolean;
}

function firstOfEach<T>(list: T[], key: (row: T) => string, keep: number): T[] {
  const seen = new Map<string, number>();
  return list.filter((row) => {
    const n = seen.get(key(row)) ?? 0;
    seen.set(key(row), n + 1);
    return n < keep;
  });
}

const isKeyField = (field: string) => field === "id" || field.endsWith("Id");
const PERSON_FIELDS = new Set(["createdById", "takenById", "loggedById", "reportedById", "closedById", "decidedById", "lentById", "receivedById", "actorId"]);

/**
 * A site's copy of some demo coils and everything recorded about them: every id (and every reference to one) gets
 * the prefix, coils get the site and the tag prefix, and the last failure is reopened so a post-mortem can be done.
 */
export function siteCopy(options: SiteCopyOptions): SiteRows {
  const { rows } = demoPool();
  const tags = new Set(options.tags ?? SITE_COPY_TAGS);
  const coilIds = new Set(rows.coils.filter((coil) => tags.has(coil.tag as string)).map((coil) => coil.id as string));
  const keep: Record<RecordTable, Row[]> = {} as never;
  keep.coils = rows.coils.filter((coil) => coilIds.has(coil.id as string));
  for (const table of ["topLoads", "components", "sweeps", "sessions", "failures", "clearances", "loans"] as const) keep[table] = rows[table].filter((row) => coilIds.has(row.coilId as string));
  const sweepIds = new Set(keep.sweeps.map((s) => s.id as string));
  const sessionIds = new Set(keep.sessions.map((s) => s.id as string));
  keep.sweepPoints = rows.sweepPoints.filter((p) => sweepIds.has(p.sweepId as string));
  keep.sweepResonances = rows.sweepResonances.filter((r) => sweepIds.has(r.sweepId as string));
  keep.samples = rows.samples.filter((s) => sessionIds.has(s.sessionId as string));
  if (options.thin) {
    keep.sweepPoints = firstOfEach(keep.sweepPoints, (p) => p.sweepId as string, 40);
    keep.samples = firstOfEach(keep.samples, (p) => p.sessionId as string, 4);
  }

  const ours = new Set<string>();
  for (const table of RECORD_TABLES) for (const row of keep[table]) if (typeof row.id === "string") ours.add(row.id);
  const rekey = (value: unknown) => (typeof value === "string" && ours.has(value) ? options.idPrefix + value : value);
  const copyRow = (row: Row): Row => {
    const copy: Row = {};
    for (const [field, value] of Object.entries(row)) {
      if (field === "id" && typeof value === "number") continue; // autoincrement (points, samples): the database numbers them
      if (PERSON_FIELDS.has(field)) copy[field] = typeof value === "string" ? (options.people?.[value] ?? null) : value;
      else copy[field] = isKeyField(field) ? rekey(value) : value;
    }
    return copy;
  };
  const copy = Object.fromEntries(RECORD_TABLES.map((table) => [table, keep[table].map(copyRow)])) as SiteRows;
  for (const coil of copy.coils) {
    coil.siteId = options.siteId;
    coil.tag = `${options.tagPrefix ?? ""}${coil.tag as string}`;
  }
  const lastFailure = copy.failures.at(-1);
  if (copy.failures.length > 1 && lastFailure) Object.assign(lastFailure, { status: "open", rootCause: null, correctiveAction: null, closedAt: null, closedById: null, replacementComponentId: null });
  copy.componentReplacements = rows.componentReplacements.filter((link) => ours.has(link.id)).map((link) => ({ id: options.idPrefix + link.id, replacedById: options.idPrefix + link.replacedById }));
  copy.sessionLoans = rows.sessionLoans.filter((link) => ours.has(link.sessionId)).map((link) => ({ sessionId: options.idPrefix + link.sessionId, loanId: options.idPrefix + link.loanId }));
  return copy;
}

/** Empties the database, sites included, and writes the organisation's default lending policy (the demo's). */
export async function resetSites(): Promise<void> {
  await resetDatabase();
  await testDb.siteMembership.deleteMany();
  await testDb.clearancePolicy.deleteMany();
  await testDb.site.deleteMany();
  const { policies } = demoPool();
  await testDb.clearancePolicy.createMany({ data: policies.map((p) => ({ ...p, siteId: null, createdById: null })) as Prisma.ClearancePolicyCreateManyInput[] });
}

export async function makeSite(slug: string, name = slug): Promise<{ id: string; slug: string; name: string }> {
  return testDb.site.create({ data: { id: `site-${slug}`, slug, name }, select: { id: true, slug: true, name: true } });
}

let cachedHash: Promise<string> | undefined;
export const SITE_TEST_PASSWORD = "site-test-pass-1";

/** A user with a role at each of `memberships` (site id → role); `organisationAdmin` for the organisation-wide admin. */
export async function makeSiteUser(email: string, memberships: Readonly<Record<string, Role>>, organisationAdmin = false) {
  cachedHash ??= hashPassword(SITE_TEST_PASSWORD);
  return testDb.user.create({
    data: {
      email,
      name: email.split("@")[0]!,
      passwordHash: await cachedHash,
      organisationAdmin,
      memberships: { create: Object.entries(memberships).map(([siteId, role]) => ({ siteId, role })) },
    },
  });
}

/** Writes a site's copy (parents first, as the demo loader does) and marks each coil's summary stale. */
export async function loadSiteRows(rows: SiteRows): Promise<void> {
  const fits = fitsBySession(
    rows.sessions.map((s) => s.id as string),
    rows.samples.map((s) => s as { sessionId: string; elapsedS: number; temperatureC: number }),
  );
  await testDb.$transaction(
    async (tx) => {
      await tx.coil.createMany({ data: rows.coils as Prisma.CoilCreateManyInput[] });
      await tx.topLoad.createMany({ data: rows.topLoads as Prisma.TopLoadCreateManyInput[] });
      await tx.component.createMany({ data: rows.components as Prisma.ComponentCreateManyInput[] });
      for (const link of rows.componentReplacements) await tx.component.update({ where: { id: link.id }, data: { replacedById: link.replacedById } });
      await tx.sweep.createMany({ data: rows.sweeps as Prisma.SweepCreateManyInput[] });
      await tx.sweepPoint.createMany({ data: rows.sweepPoints as Prisma.SweepPointCreateManyInput[] });
      await tx.sweepResonance.createMany({ data: rows.sweepResonances as Prisma.SweepResonanceCreateManyInput[] });
      await tx.runSession.createMany({ data: rows.sessions.map((s) => ({ ...s, ...fits.get(s.id as string) })) as Prisma.RunSessionCreateManyInput[] });
      await tx.heatSinkSample.createMany({ data: rows.samples as Prisma.HeatSinkSampleCreateManyInput[] });
      await tx.failure.createMany({ data: rows.failures as Prisma.FailureCreateManyInput[] });
      await tx.clearance.createMany({ data: rows.clearances as Prisma.ClearanceCreateManyInput[] });
      await tx.loan.createMany({ data: rows.loans as Prisma.LoanCreateManyInput[] });
      for (const link of rows.sessionLoans) await tx.runSession.update({ where: { id: link.sessionId }, data: { loanId: link.loanId } });
      for (const coil of rows.coils) await markCoilChanged(tx, coil.id as string);
    },
    { timeout: 120_000 },
  );
}

/** Ids and tags of one site's copy that the probes and pages need: a record of every kind. */
export interface SiteRecords {
  siteId: string;
  /** The site's short name (the site cookie, the ?site= of a label's link). */
  siteSlug: string;
  idPrefix: string;
  tagPrefix: string;
  /** Every coil tag of the copy. */
  tags: string[];
  /** A coil with a standing clearance that is not out on loan: what a steward may lend; the other ids are its records. */
  coilId: string;
  coilTag: string;
  topLoadId: string;
  /** A heat sink still fitted (not removed, not replaced). */
  componentId: string;
  sweepId: string;
  sessionId: string;
  clearanceId: string;
  /** A failure with its post-mortem done, and one still open. */
  failureId: string;
  openFailureId: string;
  /** A loan still out, with the clearance it went out on. */
  outLoanId: string;
  outLoanClearanceId: string;
  outLoanCoilTag: string;
}

export function recordsOf(rows: SiteRows, site: { id: string; slug: string }, idPrefix: string, tagPrefix = ""): SiteRecords {
  const first = <T,>(list: T[], what: string): T => {
    const found = list[0];
    if (found === undefined) throw new Error(`The site copy has no ${what}: choose other demo coils (SITE_COPY_TAGS).`);
    return found;
  };
  const outLoan = first(rows.loans.filter((l) => !l.returnedAt), "loan out");
  const coil = first(
    rows.coils.filter((c) => c.id !== outLoan.coilId && rows.clearances.some((cl) => cl.coilId === c.id && cl.verdict === "cleared")),
    "cleared coil that is in",
  );
  const replaced = new Set(rows.componentReplacements.map((link) => link.id));
  return {
    siteId: site.id,
    siteSlug: site.slug,
    idPrefix,
    tagPrefix,
    tags: rows.coils.map((c) => c.tag as string),
    coilId: coil.id as string,
    coilTag: coil.tag as string,
    topLoadId: first(rows.topLoads.filter((t) => t.coilId === coil.id && !t.retiredAt), "top load in use").id as string,
    componentId: first(rows.components.filter((c) => c.coilId === coil.id && c.kind === "heat_sink" && !c.removedAt && !replaced.has(c.id as string)), "fitted heat sink").id as string,
    sweepId: first(rows.sweeps.filter((s) => s.coilId === coil.id), "sweep").id as string,
    sessionId: first(rows.sessions.filter((s) => s.coilId === coil.id), "session").id as string,
    clearanceId: first(rows.clearances.filter((c) => c.coilId === coil.id && c.verdict === "cleared"), "clearance").id as string,
    failureId: first(rows.failures.filter((f) => f.status !== "open"), "closed failure").id as string,
    openFailureId: first(rows.failures.filter((f) => f.status === "open"), "open failure").id as string,
    outLoanId: outLoan.id as string,
    outLoanClearanceId: outLoan.clearanceId as string,
    outLoanCoilTag: rows.coils.find((c) => c.id === outLoan.coilId)!.tag as string,
  };
}

/** Deletes every record of a site (children first, as emptyDatabase does), leaving the site, its members and other sites. */
export async function deleteSiteRecords(siteId: string): Promise<void> {
  const ofCoil = { coil: { siteId } };
  await testDb.$transaction([
    testDb.auditEvent.deleteMany({ where: { siteId } }),
    testDb.coilSummary.deleteMany({ where: ofCoil }),
    testDb.runSession.updateMany({ where: { OR: [ofCoil, { loan: ofCoil }] }, data: { loanId: null } }),
    testDb.loan.deleteMany({ where: ofCoil }),
    testDb.clearance.deleteMany({ where: ofCoil }),
    testDb.clearancePolicy.deleteMany({ where: { siteId } }),
    testDb.failure.deleteMany({ where: ofCoil }),
    testDb.heatSinkSample.deleteMany({ where: { session: ofCoil } }),
    testDb.runSession.deleteMany({ where: ofCoil }),
    testDb.sweepResonance.deleteMany({ where: { sweep: ofCoil } }),
    testDb.sweepPoint.deleteMany({ where: { sweep: ofCoil } }),
    testDb.sweep.deleteMany({ where: ofCoil }),
    testDb.component.updateMany({ where: ofCoil, data: { replacedById: null } }),
    testDb.component.deleteMany({ where: ofCoil }),
    testDb.topLoad.deleteMany({ where: ofCoil }),
    testDb.coil.deleteMany({ where: { siteId } }),
  ]);
}

/**
 * How each table's rows belong to a site: everything recorded about a coil through the coil, policies and audit
 * events by their own siteId, memberships and users by membership. A model missing here fails `siteSnapshot`, so a
 * new table must say how it belongs to a site (or why it belongs to none).
 */
const SITE_OWNERSHIP: Record<string, ((siteId: string) => object) | { organisationWide: string }> = {
  Site: (siteId) => ({ id: siteId }),
  SiteMembership: (siteId) => ({ siteId }),
  User: (siteId) => ({ memberships: { some: { siteId } } }),
  SignInThrottle: { organisationWide: "keyed by e-mail address or client address, before any site is known" },
  Coil: (siteId) => ({ siteId }),
  TopLoad: (siteId) => ({ coil: { siteId } }),
  Component: (siteId) => ({ coil: { siteId } }),
  Sweep: (siteId) => ({ coil: { siteId } }),
  SweepPoint: (siteId) => ({ sweep: { coil: { siteId } } }),
  SweepResonance: (siteId) => ({ sweep: { coil: { siteId } } }),
  RunSession: (siteId) => ({ coil: { siteId } }),
  HeatSinkSample: (siteId) => ({ session: { coil: { siteId } } }),
  Failure: (siteId) => ({ coil: { siteId } }),
  ClearancePolicy: (siteId) => ({ siteId }),
  Clearance: (siteId) => ({ coil: { siteId } }),
  Loan: (siteId) => ({ OR: [{ coil: { siteId } }, { borrowerSiteId: siteId }] }),
  CoilSummary: (siteId) => ({ coil: { siteId } }),
  AuditEvent: (siteId) => ({ siteId }),
};

export function modelsWithoutSiteOwnership(): string[] {
  return Object.values(Prisma.ModelName).filter((model) => !(model in SITE_OWNERSHIP));
}

/** The rows of each table that one snapshot has and the other has not (tables with no difference left out). */
export function snapshotDifference(before: Record<string, string[]>, after: Record<string, string[]>): Record<string, { gone: string[]; new: string[] }> {
  const difference: Record<string, { gone: string[]; new: string[] }> = {};
  for (const table of new Set([...Object.keys(before), ...Object.keys(after)])) {
    const was = new Set(before[table] ?? []);
    const is = new Set(after[table] ?? []);
    const gone = [...was].filter((row) => !is.has(row));
    const added = [...is].filter((row) => !was.has(row));
    if (gone.length > 0 || added.length > 0) difference[table] = { gone: gone.slice(0, 3), new: added.slice(0, 3) };
  }
  return difference;
}

/** Every row of every table that belongs to `siteId`, sorted, for before/after comparisons. */
export async function siteSnapshot(siteId: string): Promise<Record<string, string[]>> {
  const missing = modelsWithoutSiteOwnership();
  if (missing.length > 0) throw new Error(`SITE_OWNERSHIP (test/support/site-fixtures.ts) does not say how these tables belong to a site: ${missing.join(", ")}`);
  const snapshot: Record<string, string[]> = {};
  for (const [model, owner] of Object.entries(SITE_OWNERSHIP)) {
    if (typeof owner !== "function") continue;
    const delegate = (testDb as unknown as Record<string, { findMany(args: object): Promise<unknown[]> }>)[model[0]!.toLowerCase() + model.slice(1)]!;
    const rows = await delegate.findMany({ where: owner(siteId) });
    snapshot[model] = rows.map((row) => JSON.stringify(row, (_key, value: unknown) => (typeof value === "bigint" ? value.toString() : value))).sort();
  }
  return snapshot;
}
