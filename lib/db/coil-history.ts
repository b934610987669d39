/**
 * Everything lib/analysis needs to judge one coil or the whole fleet, read in a few queries:
 * coils, every part ever fitted, every session (without heat-sink samples) and every sweep summary.
 * The fleet is the scope's site; every query is narrowed to it, so a coil of another site reads as no coil.
 */
import { prisma } from "./client";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import { Prisma, type Coil, type Component, type Failure, type RunSession, type Sweep, type TopLoad } from "./generated/client";
import { HEALTH_WINDOW, selectHealthWindow } from "../analysis/health-window";
import { findCurrentTopLoad } from "../analysis/current-top-load";
import { rawCount, rawDate, rawDateOrNull } from "./raw-read";
import { readRows } from "./adapter-read";

const sessionSelect = {
  id: true,
  coilId: true,
  startedAt: true,
  supplyVoltageV: true,
  supplyCurrentA: true,
  durationS: true,
  ambientTempC: true,
  heatSinkStartC: true,
  heatSinkEndC: true,
  runningFrequencyHz: true,
  peakSwitchVoltageV: true,
  dutyCycle: true,
  outcome: true,
  topLoadId: true,
  // The stored warm-up fit (lib/analysis/session-fit.ts): the health path judges each session by it, as its page does.
  sinkFitSampleCount: true,
  sinkFitJson: true,
} as const;

/** Failures without a completed post-mortem: each holds the coil (lib/calc/coil-health.ts). */
const openFailureSelect = { coilId: true, occurredAt: true, mode: true } as const;
const openFailuresWhere = (scope: SiteScope, coilId?: string | { in: string[] }) => ({ status: "open" as const, ...recordOfSite(scope), ...(coilId === undefined ? {} : { coilId }) });
const openFailureOrder = [{ occurredAt: "asc" as const }, { id: "asc" as const }];

const sweepSelect = { id: true, coilId: true, takenAt: true, topLoadId: true, firstSeriesResonanceHz: true } as const;

const SESSION_COLUMNS = Object.keys(sessionSelect)
  .map((column) => `s."${column}" AS "${column}"`)
  .join(", ");

type SessionRow = { [K in keyof typeof sessionSelect]: RunSession[K] };
const SWEEP_COLUMNS = Object.keys(sweepSelect)
  .map((column) => `w."${column}" AS "${column}"`)
  .join(", ");
type SweepRow = { [K in keyof typeof sweepSelect]: Sweep[K] };

function group<T extends { coilId: string }>(rows: T[]): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const row of rows) (map.get(row.coilId) ?? map.set(row.coilId, []).get(row.coilId)!).push(row);
  return map;
}

export async function getCoilHistory(scope: SiteScope, coilId: string) {
  const ofCoil = { coilId, ...recordOfSite(scope) };
  const [coil, components, sessions, sweeps, topLoads, openFailures] = await Promise.all([
    prisma.coil.findUnique({ where: { id: coilId, ...coilOfSite(scope) } }),
    prisma.component.findMany({ where: ofCoil, orderBy: [{ installedAt: "asc" }, { id: "asc" }] }),
    prisma.runSession.findMany({ where: ofCoil, select: sessionSelect, orderBy: [{ startedAt: "asc" }, { id: "asc" }] }),
    prisma.sweep.findMany({ where: ofCoil, select: sweepSelect, orderBy: [{ takenAt: "asc" }, { id: "asc" }] }),
    prisma.topLoad.findMany({ where: ofCoil, orderBy: [{ createdAt: "asc" }, { id: "asc" }] }),
    prisma.failure.findMany({ where: openFailuresWhere(scope, coilId), select: openFailureSelect, orderBy: openFailureOrder }),
  ]);
  return coil ? { coil, components, sessions, sweeps, topLoads, openFailures } : null;
}

export type CoilHistory = NonNullable<Awaited<ReturnType<typeof getCoilHistory>>>;

/**
 * What the coil page needs without its whole logbook: the sessions of the health window (the baseline and the
 * recent run, lib/analysis/health-window.ts) read from both ends of the (coilId, startedAt) index, and for the
 * prediction table (comparisonSessions) also the latest session that logged a running frequency with the top load
 * fitted now, when that is older than the window. A 500-session coil reads ~64 sessions instead of 500.
 */
/** The coil with its parts and top loads, when the caller has read them already (the coil page has, for its head). */
export type KnownCoilRecords = Coil & { components: Component[]; topLoads: TopLoad[] };

/** Ties broken by id, the same way in SQL and here (ids are lowercase letters and digits, so no collation differs). */
const compareIds = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

function splitKnown({ components, topLoads, ...rest }: KnownCoilRecords & { createdBy?: unknown }) {
  const { createdBy: _createdBy, ...coil } = rest;
  return { coil: coil as Coil, components, topLoads };
}

/**
 * Null for no such coil at the scope's site. A known coil is the caller's read of it; one of another site is not
 * found all the same, and every statement below joins the coil at the scope's site.
 */
export async function getCoilPageHistory(scope: SiteScope, coilId: string, knownCoil?: KnownCoilRecords) {
  const { baselineSessions, recentSessions } = HEALTH_WINDOW;
  if (knownCoil && (knownCoil.id !== coilId || knownCoil.siteId !== scope.siteId)) return null;
  const known = knownCoil && splitKnown(knownCoil);
  const site = scope.siteId;
  // Raw statements (lib/db/raw-read.ts says why): this is the coil page's main read.
  const [coils, components, windowRows, sweeps, topLoads, openFailureRows] = await Promise.all([
    known ? [known.coil] : readRows<Coil>(Prisma.sql`SELECT * FROM "Coil" WHERE id = ${coilId} AND "siteId" = ${site}`),
    known
      ? [...known.components].sort((a, b) => a.installedAt.getTime() - b.installedAt.getTime() || compareIds(a, b))
      : readRows<Component>(Prisma.sql`
          SELECT p.* FROM "Component" p JOIN "Coil" ON "Coil".id = p."coilId" WHERE p."coilId" = ${coilId} AND "Coil"."siteId" = ${site}
          ORDER BY p."installedAt", p.id`),
    // Both ends of the (coilId, startedAt) index in one statement; a session in both halves comes back twice.
    readRows<RawSessionRow>(Prisma.sql`
      SELECT * FROM (SELECT ${Prisma.raw(SESSION_COLUMNS)} FROM "RunSession" s JOIN "Coil" ON "Coil".id = s."coilId"
                     WHERE s."coilId" = ${coilId} AND "Coil"."siteId" = ${site}
                     ORDER BY s."startedAt", s.id LIMIT ${baselineSessions}) AS baseline
      UNION ALL
      SELECT * FROM (SELECT ${Prisma.raw(SESSION_COLUMNS)} FROM "RunSession" s JOIN "Coil" ON "Coil".id = s."coilId"
                     WHERE s."coilId" = ${coilId} AND "Coil"."siteId" = ${site}
                     ORDER BY s."startedAt" DESC, s.id DESC LIMIT ${recentSessions}) AS recent`),
    readRows<SweepRow>(Prisma.sql`
      SELECT ${Prisma.raw(SWEEP_COLUMNS)} FROM "Sweep" w JOIN "Coil" ON "Coil".id = w."coilId" WHERE w."coilId" = ${coilId} AND "Coil"."siteId" = ${site}
      ORDER BY w."takenAt", w.id`),
    known
      ? [...known.topLoads].sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || compareIds(a, b))
      : readRows<TopLoad>(Prisma.sql`
          SELECT t.* FROM "TopLoad" t JOIN "Coil" ON "Coil".id = t."coilId" WHERE t."coilId" = ${coilId} AND "Coil"."siteId" = ${site}
          ORDER BY t."createdAt", t.id`),
    // Usually none, but through the query API even an index probe that finds nothing cost ~1 ms of plan compilation.
    // A literal status: PostgreSQL compares its enum with a literal, not with a text parameter.
    readRows<OpenFailureRow>(Prisma.sql`
      SELECT f."coilId" AS "coilId", f."occurredAt" AS "occurredAt", f.mode AS mode FROM "Failure" f JOIN "Coil" ON "Coil".id = f."coilId"
      WHERE f."coilId" = ${coilId} AND "Coil"."siteId" = ${site} AND f.status = 'open'
      ORDER BY f."occurredAt", f.id`),
  ]);
  const coil = coils[0];
  if (!coil) return null;
  const openFailures = openFailureRows.map(toOpenFailure);
  const byId = new Map(windowRows.map((row) => [row.id, toSessionRow(row)]));
  const sessions = [...byId.values()].sort((a, b) => a.startedAt.getTime() - b.startedAt.getTime() || compareIds(a, b));
  const topLoadId = findCurrentTopLoad(topLoads, sweeps, sessions)?.id ?? null;
  const [running] = await readRows<SessionRow>(Prisma.sql`
    SELECT ${Prisma.raw(SESSION_COLUMNS)} FROM "RunSession" s JOIN "Coil" ON "Coil".id = s."coilId"
    WHERE s."coilId" = ${coilId} AND "Coil"."siteId" = ${site} AND s."topLoadId" ${topLoadId === null ? Prisma.sql`IS NULL` : Prisma.sql`= ${topLoadId}`} AND s."runningFrequencyHz" IS NOT NULL
    ORDER BY s."startedAt" DESC, s.id DESC LIMIT 1`);
  const comparisonSessions = running && !byId.has(running.id) ? [running, ...sessions] : sessions;
  return { coil, components, sessions, comparisonSessions, sweeps, topLoads, openFailures };
}

/** The same for every coil of the scope's site, grouped by coil id (six queries in all). */
export async function getFleetHistory(scope: SiteScope): Promise<CoilHistory[]> {
  const ofSite = recordOfSite(scope);
  const [coils, components, sessions, sweeps, topLoads, openFailures] = await Promise.all([
    prisma.coil.findMany({ where: coilOfSite(scope), orderBy: { tag: "asc" } }),
    prisma.component.findMany({ where: ofSite, orderBy: { installedAt: "asc" } }),
    prisma.runSession.findMany({ where: ofSite, select: sessionSelect, orderBy: { startedAt: "asc" } }),
    prisma.sweep.findMany({ where: ofSite, select: sweepSelect, orderBy: { takenAt: "asc" } }),
    prisma.topLoad.findMany({ where: ofSite, orderBy: { createdAt: "asc" } }),
    prisma.failure.findMany({ where: openFailuresWhere(scope), select: openFailureSelect, orderBy: openFailureOrder }),
  ]);
  const c = group(components);
  const s = group(sessions);
  const w = group(sweeps);
  const t = group(topLoads);
  const f = group(openFailures);
  return coils.map((coil) => ({
    coil,
    components: c.get(coil.id) ?? [],
    sessions: s.get(coil.id) ?? [],
    sweeps: w.get(coil.id) ?? [],
    topLoads: t.get(coil.id) ?? [],
    openFailures: f.get(coil.id) ?? [],
  }));
}

export interface CoilSessionTotals {
  sessionCount: number;
  totalDurationS: number;
  lastSessionAt: Date | null;
}

export type CoilHealthHistory = CoilHistory & { totals: CoilSessionTotals };

type RawSessionRow = Omit<SessionRow, "startedAt"> & { startedAt: Date | string };
type OpenFailureRow = { coilId: string; occurredAt: Date | string; mode: Failure["mode"] };
const toOpenFailure = (row: OpenFailureRow) => ({ coilId: row.coilId, occurredAt: rawDate(row.occurredAt), mode: row.mode });

/** A session from a compound raw statement, whose startedAt may be the stored text on SQLite (lib/db/raw-read.ts). */
function toSessionRow(row: RawSessionRow): SessionRow {
  return { ...row, startedAt: rawDate(row.startedAt) };
}

/** The same in place, for rows this module read and owns (the dashboard's window: no copy of 31 500 rows). */
function decodeSessionRow(row: RawSessionRow): SessionRow {
  row.startedAt = rawDate(row.startedAt);
  return row as SessionRow;
}

/**
 * What the fleet dashboard needs for every coil of the scope's site (or the listed ones among them; a listed coil of
 * another site is left out) without reading every session: each coil's
 * sessions cut to the health window (lib/analysis/health-window.ts) and its running totals as SQL aggregates. Two
 * index seeks per coil find where its window starts, so the rows read stay ~63 a coil however long the logbooks grow.
 *
 * Every read is one raw statement straight through the driver adapter (lib/db/adapter-read.ts readRows): this is the
 * cold dashboard's whole read, and through the query API and `$queryRaw` the pipeline around the statements (plan
 * compilation, serialising 31 500 window rows and parsing them back) cost more than the statements themselves.
 * test/fleet-health-window.test.ts checks the answer against the query API's whole-logbook read on SQLite and
 * PostgreSQL: the same coils, parts, sweeps, top loads, open failures, window and totals.
 */
export async function getFleetHealthHistory(scope: SiteScope, coilIds?: readonly string[]): Promise<CoilHealthHistory[]> {
  if (coilIds?.length === 0) return [];
  const { baselineSessions, recentSessions } = HEALTH_WINDOW;
  const site = scope.siteId;
  // Records of the site's coils (or of the listed ones among them): every statement joins the coil at the site.
  const ofCoils = (alias: string) =>
    coilIds
      ? Prisma.sql`JOIN "Coil" c ON c.id = ${Prisma.raw(alias)}."coilId" WHERE c."siteId" = ${site} AND c.id IN (${Prisma.join(coilIds)})`
      : Prisma.sql`JOIN "Coil" c ON c.id = ${Prisma.raw(alias)}."coilId" WHERE c."siteId" = ${site}`;
  const coilFilter = coilIds ? Prisma.sql`WHERE c."siteId" = ${site} AND c.id IN (${Prisma.join(coilIds)})` : Prisma.sql`WHERE c."siteId" = ${site}`;
  // Ties broken by id: the query API's orderBy on the date alone left their order to the database.
  const [coils, components, sweeps, topLoads, totals, openFailures, rawSessions] = await Promise.all([
    readRows<Coil>(Prisma.sql`SELECT c.* FROM "Coil" c ${coilFilter} ORDER BY c.tag`),
    readRows<Component>(Prisma.sql`SELECT p.* FROM "Component" p ${ofCoils("p")} ORDER BY p."installedAt", p.id`),
    readRows<SweepRow>(Prisma.sql`SELECT ${Prisma.raw(SWEEP_COLUMNS)} FROM "Sweep" w ${ofCoils("w")} ORDER BY w."takenAt", w.id`),
    readRows<TopLoad>(Prisma.sql`SELECT t.* FROM "TopLoad" t ${ofCoils("t")} ORDER BY t."createdAt", t.id`),
    // The covering (coilId, startedAt, durationS) index answers these without a table lookup.
    readRows<{ coilId: string; sessionCount: unknown; totalDurationS: number | null; lastSessionAt: unknown }>(Prisma.sql`
      SELECT s."coilId" AS "coilId", count(*) AS "sessionCount", sum(s."durationS") AS "totalDurationS", max(s."startedAt") AS "lastSessionAt"
      FROM "RunSession" s ${ofCoils("s")} GROUP BY s."coilId"`),
    // A literal status: PostgreSQL compares its enum with a literal, not with a text parameter.
    readRows<OpenFailureRow>(Prisma.sql`
      SELECT f."coilId" AS "coilId", f."occurredAt" AS "occurredAt", f.mode AS mode FROM "Failure" f ${ofCoils("f")} AND f.status = 'open'
      ORDER BY f."occurredAt", f.id`),
    // Raw SQL because the window is per coil (a LIMIT/OFFSET per group), which Prisma's query API cannot say;
    // both halves walk the (coilId, startedAt) index. Ties on startedAt may add a row; selectHealthWindow trims.
    // Portable SQL (SQLite and PostgreSQL): quoted identifiers, and a coil with fewer sessions than the window
    // starts from its first session (coalesce with its minimum) rather than from an empty-string sentinel.
    // UNION ALL, ordered by coil: a session in both halves comes back twice, side by side, and is dropped below
    // (UNION's de-duplication sorted every row once more, a third of the statement's time on SQLite).
    readRows<RawSessionRow>(Prisma.sql`
      SELECT ${Prisma.raw(SESSION_COLUMNS)} FROM "Coil" c JOIN "RunSession" s ON s."coilId" = c.id
        AND s."startedAt" >= coalesce(
          (SELECT r."startedAt" FROM "RunSession" r WHERE r."coilId" = c.id ORDER BY r."startedAt" DESC LIMIT 1 OFFSET ${recentSessions - 1}),
          (SELECT min(r."startedAt") FROM "RunSession" r WHERE r."coilId" = c.id))
      ${coilFilter}
      UNION ALL
      SELECT ${Prisma.raw(SESSION_COLUMNS)} FROM "Coil" c JOIN "RunSession" s ON s."coilId" = c.id
        AND s."startedAt" <= (SELECT r."startedAt" FROM "RunSession" r WHERE r."coilId" = c.id ORDER BY r."startedAt" ASC LIMIT 1 OFFSET ${baselineSessions - 1})
      ${coilFilter}
      ORDER BY "coilId", "startedAt", "id"`),
  ]);
  const sessions: SessionRow[] = [];
  for (const row of rawSessions) if (row.id !== sessions.at(-1)?.id) sessions.push(decodeSessionRow(row));
  const s = group(sessions);
  const c = group(components);
  const w = group(sweeps);
  const t = group(topLoads);
  const f = group(openFailures.map(toOpenFailure));
  const totalsByCoil = new Map(totals.map((row) => [row.coilId, row]));
  return coils.map((coil) => {
    const total = totalsByCoil.get(coil.id);
    return {
      coil,
      components: c.get(coil.id) ?? [],
      sessions: selectHealthWindow(s.get(coil.id) ?? []),
      sweeps: w.get(coil.id) ?? [],
      topLoads: t.get(coil.id) ?? [],
      openFailures: f.get(coil.id) ?? [],
      totals: total
        ? { sessionCount: rawCount(total.sessionCount), totalDurationS: total.totalDurationS ?? 0, lastSessionAt: rawDateOrNull(total.lastSessionAt) }
        : { sessionCount: 0, totalDurationS: 0, lastSessionAt: null },
    };
  });
}
