/**
 * One coil's logbook as a single timeline, newest first: sessions, sweeps, failures, parts fitted
 * and removed, clearances and loans. Each kind is read newest-first up to the cap, then merged, so
 * the page costs a handful of small queries however long the coil's history is. Every statement joins the coil at
 * the scope's site, so a coil of another site has an empty timeline and no counts, as one that does not exist.
 */
import { readRows } from "./adapter-read";
import { Prisma, type Clearance, type Failure } from "./generated/client";
import type { SiteScope } from "./site-scope";
import type { TimelineFilter } from "../validation/timeline";
import type { KnownStandingRecords } from "./coil-standing";

export type TimelineKind = "session" | "sweep" | "failure" | "part-fitted" | "part-removed" | "clearance" | "loan-out" | "loan-back";

/** Which event kinds each filter of the coil page's logbook keeps. */
export const TIMELINE_FILTER_KINDS: Record<TimelineFilter, readonly TimelineKind[]> = {
  sessions: ["session"],
  sweeps: ["sweep"],
  failures: ["failure"],
  parts: ["part-fitted", "part-removed"],
  clearances: ["clearance"],
  loans: ["loan-out", "loan-back"],
};

type RecordCounts = { sessions: number; sweeps: number; failures: number; components: number; clearances: number; loans: number };

/** How many records stand behind a filter's events (a part or a loan gives one or two: fitted/removed, out/back). */
function countEvents(counts: RecordCounts, filter: TimelineFilter | null): number {
  switch (filter) {
    case "sessions":
    case "sweeps":
    case "failures":
    case "clearances":
      return counts[filter];
    case "parts":
      return counts.components;
    case "loans":
      return counts.loans;
    case null:
      return counts.sessions + counts.sweeps + counts.failures + counts.components + counts.clearances + counts.loans;
  }
}

export interface TimelineEvent {
  kind: TimelineKind;
  at: Date;
  title: string;
  detail: string;
  /** The record's own page, when it has one. */
  href: string | null;
}

/**
 * How many records of each kind the coil has, or null for no such coil: one statement of per-table counts (each an
 * index range on coilId). Not Prisma's relation `_count`, which groups the whole table by coil before joining
 * (19 ms at 250 000 sessions), nor six count queries (each a Prisma round trip). Portable SQL; counts come back
 * as bigint on PostgreSQL.
 */
async function countRecords(scope: SiteScope, coilId: string) {
  const count = (table: string) => Prisma.raw(`(SELECT count(*) FROM "${table}" t WHERE t."coilId" = c.id)`);
  const [row] = await readRows<Record<"sessions" | "sweeps" | "failures" | "components" | "clearances" | "loans", bigint | number>>(Prisma.sql`
    SELECT ${count("RunSession")} AS "sessions", ${count("Sweep")} AS "sweeps", ${count("Failure")} AS "failures",
           ${count("Component")} AS "components", ${count("Clearance")} AS "clearances", ${count("Loan")} AS "loans"
    FROM "Coil" c WHERE c.id = ${coilId} AND c."siteId" = ${scope.siteId}`);
  if (!row) return null;
  return {
    sessions: Number(row.sessions),
    sweeps: Number(row.sweeps),
    failures: Number(row.failures),
    components: Number(row.components),
    clearances: Number(row.clearances),
    loans: Number(row.loans),
  };
}

type PartRow = { id: string; installedAt: Date; removedAt: Date | null; partNumber: string; kind: string; removalReason: string | null };
type SessionRow = { id: string; startedAt: Date; supplyVoltageV: number; supplyCurrentA: number; durationS: number; outcome: string };
type SweepRow = { id: string; takenAt: Date; firstSeriesResonanceHz: number | null; topLoadId: string | null };

/**
 * What the caller has read already (the coil page has), so the timeline does not read it again: every part, every
 * sweep with every top load (for their names), and sessions that include at least the coil's `limit` newest.
 */
export interface KnownTimelineRecords {
  parts: readonly PartRow[];
  sweeps?: readonly SweepRow[];
  topLoads?: readonly { id: string; name: string }[];
  sessionsIncludingNewest?: readonly SessionRow[];
}

/** Newest first with an id tie-break, the order the raw statements below use. */
function newestFirst<T extends { id: string }>(rows: readonly T[], at: (row: T) => Date | null, take: number): T[] {
  return rows
    .filter((row) => at(row) !== null)
    .sort((a, b) => at(b)!.getTime() - at(a)!.getTime() || (a.id < b.id ? 1 : a.id > b.id ? -1 : 0))
    .slice(0, take);
}

/**
 * The coil's newest `limit` events, of the kinds `filter` keeps (null: every kind). Each kind is read newest first up to
 * `limit`, so a filtered timeline still shows up to `limit` of its kind.
 */
export async function getCoilTimeline(scope: SiteScope, coilId: string, limit = 25, known?: KnownTimelineRecords, filter: TimelineFilter | null = null) {
  const take = limit;
  const site = scope.siteId;
  const knownParts = known?.parts;
  const knownSweeps = known?.sweeps && known.topLoads ? { sweeps: known.sweeps, topLoadName: new Map(known.topLoads.map((t) => [t.id, t.name])) } : null;
  // Raw statements, each newest first on its (coilId, time) index with an id tie-break (lib/db/raw-read.ts says why).
  const [sessions, sweeps, failures, fitted, removed, clearances, loansOut, loansBack, counts] = await Promise.all([
    known?.sessionsIncludingNewest
      ? newestFirst(known.sessionsIncludingNewest, (s) => s.startedAt, take)
      : readRows<SessionRow>(Prisma.sql`
          SELECT r.id, r."startedAt", r."supplyVoltageV", r."supplyCurrentA", r."durationS", r.outcome FROM "RunSession" r JOIN "Coil" ON "Coil".id = r."coilId"
          WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY r."startedAt" DESC, r.id DESC LIMIT ${take}`),
    knownSweeps
      ? newestFirst(knownSweeps.sweeps, (s) => s.takenAt, take).map((s) => ({ ...s, topLoadName: s.topLoadId === null ? null : (knownSweeps.topLoadName.get(s.topLoadId) ?? null) }))
      : readRows<(SweepRow & { topLoadName: string | null })>(Prisma.sql`
          SELECT w.id, w."takenAt", w."firstSeriesResonanceHz", w."topLoadId", t.name AS "topLoadName" FROM "Sweep" w
          JOIN "Coil" ON "Coil".id = w."coilId" LEFT JOIN "TopLoad" t ON t.id = w."topLoadId"
          WHERE w."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY w."takenAt" DESC, w.id DESC LIMIT ${take}`),
    readRows<{ id: string; occurredAt: Date; mode: Failure["mode"]; symptoms: string; status: string }>(Prisma.sql`
      SELECT r.id, r."occurredAt", r.mode, r.symptoms, r.status FROM "Failure" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY r."occurredAt" DESC, r.id DESC LIMIT ${take}`),
    knownParts
      ? newestFirst(knownParts, (c) => c.installedAt, take)
      : readRows<PartRow>(Prisma.sql`
          SELECT r.id, r."installedAt", r."removedAt", r."partNumber", r.kind, r."removalReason" FROM "Component" r JOIN "Coil" ON "Coil".id = r."coilId"
          WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY r."installedAt" DESC, r.id DESC LIMIT ${take}`),
    knownParts
      ? newestFirst(knownParts, (c) => c.removedAt, take)
      : readRows<PartRow>(Prisma.sql`
          SELECT r.id, r."installedAt", r."removedAt", r."partNumber", r.kind, r."removalReason" FROM "Component" r JOIN "Coil" ON "Coil".id = r."coilId"
          WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} AND r."removedAt" IS NOT NULL ORDER BY r."removedAt" DESC, r.id DESC LIMIT ${take}`),
    readRows<{ id: string; coilId: string; decidedAt: Date; verdict: Clearance["verdict"]; validUntil: Date; lapsedAt: Date | null }>(Prisma.sql`
      SELECT r.id, r."coilId", r."decidedAt", r.verdict, r."validUntil", r."lapsedAt" FROM "Clearance" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY r."decidedAt" DESC, r.id DESC LIMIT ${take}`),
    readRows<{ id: string; outAt: Date; borrower: string; event: string; expectedBackAt: Date; returnedAt: Date | null }>(Prisma.sql`
      SELECT r.id, r."outAt", r.borrower, r.event, r."expectedBackAt", r."returnedAt" FROM "Loan" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} ORDER BY r."outAt" DESC, r.id DESC LIMIT ${take}`),
    readRows<{ id: string; returnedAt: Date; borrower: string; returnCondition: string | null }>(Prisma.sql`
      SELECT r.id, r."returnedAt", r.borrower, r."returnCondition" FROM "Loan" r JOIN "Coil" ON "Coil".id = r."coilId"
      WHERE r."coilId" = ${coilId} AND "Coil"."siteId" = ${site} AND r."returnedAt" IS NOT NULL ORDER BY r."returnedAt" DESC, r.id DESC LIMIT ${take}`),
    countRecords(scope, coilId),
  ]);

  const events: TimelineEvent[] = [
    ...sessions.map((s) => ({ kind: "session" as const, at: s.startedAt, title: "Run session", detail: `${s.supplyVoltageV} V, ${s.supplyCurrentA} A for ${Math.round(s.durationS)} s (${s.outcome})`, href: `/sessions/${s.id}` })),
    ...sweeps.map((s) => ({ kind: "sweep" as const, at: s.takenAt, title: "Sweep", detail: `${s.firstSeriesResonanceHz === null ? "no resonance found" : `first series resonance ${(s.firstSeriesResonanceHz / 1000).toFixed(1)} kHz`} (${s.topLoadName ?? "no top load"})`, href: `/sweeps/${s.id}` })),
    ...failures.map((f) => ({ kind: "failure" as const, at: f.occurredAt, title: "Failure", detail: `${f.mode.replace(/_/g, " ")}: ${f.symptoms} (${f.status === "open" ? "post-mortem open" : "post-mortem done"})`, href: `/failures/${f.id}` })),
    ...fitted.map((c) => ({ kind: "part-fitted" as const, at: c.installedAt, title: "Part fitted", detail: `${c.partNumber} (${c.kind.replace(/_/g, " ")})`, href: null })),
    ...removed.map((c) => ({ kind: "part-removed" as const, at: c.removedAt!, title: "Part removed", detail: `${c.partNumber} (${c.kind.replace(/_/g, " ")})${c.removalReason ? `: ${c.removalReason}` : ""}`, href: null })),
    ...clearances.map((c) => ({ kind: "clearance" as const, at: c.decidedAt, title: c.verdict === "cleared" ? "Passed the team's checks" : "Clearance refused", detail: `valid until ${c.validUntil.toISOString().slice(0, 10)}${c.lapsedAt ? `, lapsed ${c.lapsedAt.toISOString().slice(0, 10)}` : ""}`, href: null })),
    ...loansOut.map((l) => ({ kind: "loan-out" as const, at: l.outAt, title: "Lent out", detail: `to ${l.borrower} for ${l.event}`, href: null })),
    ...loansBack.map((l) => ({ kind: "loan-back" as const, at: l.returnedAt!, title: "Returned", detail: `from ${l.borrower}${l.returnCondition ? ` (${l.returnCondition})` : ""}`, href: null })),
  ];
  const kept = filter === null ? events : events.filter((e) => TIMELINE_FILTER_KINDS[filter].includes(e.kind));
  kept.sort((a, b) => b.at.getTime() - a.at.getTime());
  const shown = kept.slice(0, limit);
  // More than shown: more events were read than fit, or more records exist than events shown (each gives at least one).
  const truncated = kept.length > limit || (counts !== null && countEvents(counts, filter) > shown.length);
  // The newest clearances, failures and loans as read (newest first), with how many exist: the coil page's standing
  // (lib/db/coil-standing.ts) takes what it needs from them instead of reading them again.
  const standingRecords: KnownStandingRecords | undefined = counts === null ? undefined : {
    clearancesNewestFirst: clearances,
    clearanceCount: counts.clearances,
    failures,
    failureCount: counts.failures,
    loansNewestFirst: loansOut,
    loanCount: counts.loans,
  };
  return { events: shown, counts, truncated, standingRecords };
}
