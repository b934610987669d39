/**
 * The per-coil summary behind the fleet dashboard: each coil's health, reasons, latest margins and running totals,
 * stored with what they were computed from, so a dashboard view reads 500 rows instead of re-judging 500 logbooks.
 *
 * How it stays true:
 *  - every write that can change those figures calls markCoilChanged inside its own transaction, which bumps the
 *    coil's `revision` (test/coil-summary-writes.test.ts fails when a lib/db write to a logbook table forgets it);
 *  - a reader trusts a row only while its computedRevision equals revision, it was judged under the current policy
 *    version, and the clock is inside [computedAt, validUntil) — lib/analysis/health-validity.ts says when the
 *    passing of time alone would change the verdict;
 *  - anything else is recomputed and stored with a conditional update (only where revision is still the one read
 *    before the logbook was), so a write racing the computation leaves the row stale instead of wrongly fresh.
 *
 * The policy version stored is the coil's site's effective version (lib/db/policy.ts: max of the site's and the
 * default's latest), so a site tightening its policy re-judges its own coils only. Reads and stores are narrowed to
 * the scope's site; markCoilChanged is the exception, called inside a write that has already found the coil in its
 * scope, and it returns nothing.
 */
import type { Tx } from "./client";
import { readRows } from "./adapter-read";
import { inAdapterTransaction } from "./session-write";
import { Prisma, type CoilSummary } from "./generated/client";
import { getFleetHealthHistory, type CoilHealthHistory } from "./coil-history";
import type { PolicyVersion } from "./policy";
import { judgeCoilFigures } from "../analysis/coil-health-input";
import { computeHealthValidUntil } from "../analysis/health-validity";
import type { HealthStatus } from "../calc/coil-health";
import { briefSessionMargins, type SessionMarginsBrief } from "../analysis/margin-brief";
import { collectHeadroomTrendOf, type HeadroomTrend } from "../analysis/headroom-trend";
import type { SiteScope } from "./site-scope";

/**
 * Records that the coil's logbook changed. Call it in the same transaction as the write: a Prisma transaction, or the
 * statement runner of a write that runs its own SQL (session-write.ts), which gets the same upsert as one statement.
 */
export async function markCoilChanged(tx: Tx | { execute(statement: Prisma.Sql): Promise<number> }, coilId: string): Promise<void> {
  if ("execute" in tx) {
    await tx.execute(Prisma.sql`
      INSERT INTO "CoilSummary" ("coilId", revision) VALUES (${coilId}, 1)
      ON CONFLICT ("coilId") DO UPDATE SET revision = "CoilSummary".revision + 1`);
    return;
  }
  await tx.coilSummary.upsert({ where: { coilId }, create: { coilId, revision: 1 }, update: { revision: { increment: 1 } } });
}

/** What the dashboard shows of a coil that takes its logbook to work out. */
export interface CoilFigures {
  health: HealthStatus;
  reasons: string[];
  /** The latest session's margins in brief (headroom, status, formula): what the dashboard shows. */
  latestMargins: SessionMarginsBrief | null;
  /** The last few sessions' headrooms per margin with the policy's thresholds (the dashboard's trend pictures). */
  headroomTrend: HeadroomTrend;
  sessionCount: number;
  totalRunS: number;
  lastSessionAt: Date | null;
  lastSweepAt: Date | null;
  /** When time alone would change health or reasons; null: never. */
  validUntil: Date | null;
}

const HEALTH_STATUSES: readonly string[] = ["fine", "watch", "hold", "not enough data"] satisfies HealthStatus[];

/** The coil's figures from its health window (lib/analysis), judged at `now` under `policy`. */
export function computeCoilFigures({ coil, components, sessions, sweeps, openFailures, totals }: CoilHealthHistory, policy: PolicyVersion, now: Date): CoilFigures {
  // judgeCoilFigures: judgeCoil's figures with the window's older sessions analysed for their headrooms only (the
  // summary stores the latest session's margins and the recent headrooms, never the older sessions' notes).
  const judged = judgeCoilFigures({ coil, components, sessions, sweeps, openFailures }, policy.rules, now);
  return {
    health: judged.health?.status ?? "not enough data",
    reasons: judged.reasons,
    latestMargins: judged.latest ? briefSessionMargins(judged.latest.analysis.margins) : null,
    headroomTrend: collectHeadroomTrendOf(judged.headrooms, policy.rules),
    sessionCount: totals.sessionCount,
    totalRunS: totals.totalDurationS,
    lastSessionAt: totals.lastSessionAt,
    lastSweepAt: sweeps.at(-1)?.takenAt ?? null,
    validUntil: judged.health ? computeHealthValidUntil(judged.health, now) : null,
  };
}

/** A stored row's figures, or null when they cannot be trusted at `now` under `policyVersion`. */
export function readCurrentFigures(row: CoilSummary, policyVersion: number, now: Date): CoilFigures | null {
  const current =
    row.computedRevision === row.revision &&
    row.policyVersion === policyVersion &&
    row.computedAt !== null &&
    row.computedAt.getTime() <= now.getTime() &&
    (row.validUntil === null || now.getTime() < row.validUntil.getTime());
  if (!current || row.health === null || !HEALTH_STATUSES.includes(row.health) || row.reasonsJson === null || row.latestMarginsJson === null || row.headroomTrendJson === null) return null;
  return {
    health: row.health as HealthStatus,
    reasons: JSON.parse(row.reasonsJson) as string[],
    latestMargins: JSON.parse(row.latestMarginsJson) as SessionMarginsBrief | null,
    headroomTrend: JSON.parse(row.headroomTrendJson) as HeadroomTrend,
    sessionCount: row.sessionCount,
    totalRunS: row.totalRunS,
    lastSessionAt: row.lastSessionAt,
    lastSweepAt: row.lastSweepAt,
    validUntil: row.validUntil,
  };
}

/**
 * Rows for coils that have none yet (added before this table, or straight into the database), at revision 0: one
 * statement for all of them, narrowed to the scope's site, and a row a write created meanwhile is left as it is (its
 * revision is then past 0, so that coil's result will not be stored). Straight through the driver adapter
 * (session-write.ts inAdapterTransaction): through the query API a cold dashboard's 500 rows cost a compiled createMany.
 */
async function createMissingSummaries(scope: SiteScope, coilIds: readonly string[]): Promise<void> {
  if (coilIds.length === 0) return;
  await inAdapterTransaction((runner) =>
    runner.execute(Prisma.sql`
      INSERT INTO "CoilSummary" ("coilId")
      SELECT c.id FROM "Coil" c WHERE c."siteId" = ${scope.siteId} AND c.id IN (${Prisma.join(coilIds)})
      ON CONFLICT ("coilId") DO NOTHING`),
  );
}

export interface ComputedFigures {
  coilId: string;
  /** The revision read before the logbook was. */
  fromRevision: number;
  figures: CoilFigures;
}

/**
 * Stores figures only where the coil's revision is still the one they were computed from; returns the coil ids
 * stored. Each update is one conditional statement, so no write can slip between the check and the store.
 *
 * Raw SQL, all in one transaction on the client's driver adapter (session-write.ts inAdapterTransaction): a cold
 * dashboard stores hundreds of rows, and through the query API each `updateMany` was compiled into a plan again
 * (lib/db/raw-read.ts says why that costs), ~1 ms a row; `$executeRaw` in a `$transaction` still paid ~0.2 ms of
 * Prisma's pipeline a row. The statement is the same conditional update written out once, portable (quoted
 * identifiers, parameters only; the adapters bind dates as the query API stores them), and narrowed to the scope's
 * site in its own WHERE. test/coil-summary-store.test.ts checks its rows against the query API's on SQLite and
 * PostgreSQL.
 */
export async function storeCoilFigures(scope: SiteScope, computed: readonly ComputedFigures[], policyVersion: number, computedAt: Date): Promise<string[]> {
  if (computed.length === 0) return [];
  const counts = await inAdapterTransaction(async (runner) => {
    const stored: number[] = [];
    for (const { coilId, fromRevision, figures } of computed) {
      stored.push(
        await runner.execute(Prisma.sql`
          UPDATE "CoilSummary" SET
            "computedRevision" = ${fromRevision},
            "policyVersion" = ${policyVersion},
            "computedAt" = ${computedAt},
            "validUntil" = ${figures.validUntil},
            "health" = ${figures.health},
            "reasonsJson" = ${JSON.stringify(figures.reasons)},
            "latestMarginsJson" = ${JSON.stringify(figures.latestMargins)},
            "headroomTrendJson" = ${JSON.stringify(figures.headroomTrend)},
            "sessionCount" = ${figures.sessionCount},
            "totalRunS" = ${figures.totalRunS},
            "lastSessionAt" = ${figures.lastSessionAt},
            "lastSweepAt" = ${figures.lastSweepAt}
          WHERE "coilId" = ${coilId} AND "revision" = ${fromRevision}
            AND EXISTS (SELECT 1 FROM "Coil" WHERE "Coil"."id" = "CoilSummary"."coilId" AND "Coil"."siteId" = ${scope.siteId})`),
      );
    }
    return stored;
  });
  return computed.filter((_, i) => counts[i] === 1).map((c) => c.coilId);
}

/**
 * Reads each coil's health window and computes its figures (the slow path, kept for stale rows); coils of other sites
 * are left out (the history read finds only the site's). In the listed order batch by batch, by tag within a batch.
 */
export async function computeFiguresFor(
  scope: SiteScope,
  coilIds: readonly string[],
  revisions: ReadonlyMap<string, number>,
  policy: PolicyVersion,
  now: Date,
  { batchCoils = FIGURES_BATCH_COILS }: { batchCoils?: number } = {},
): Promise<ComputedFigures[]> {
  const computed: ComputedFigures[] = [];
  // A batch of coils at a time: each batch's rows are judged and dropped while still young, where reading 500 coils'
  // windows first kept 31 500 rows alive through the whole judgement and the garbage collector took a third of a
  // cold dashboard's time promoting and then sweeping them.
  for (let start = 0; start < coilIds.length; start += batchCoils) {
    const histories = await getFleetHealthHistory(scope, coilIds.slice(start, start + batchCoils));
    for (const history of histories) {
      computed.push({ coilId: history.coil.id, fromRevision: revisions.get(history.coil.id) ?? 0, figures: computeCoilFigures(history, policy, now) });
    }
  }
  return computed;
}

/**
 * Coils read and judged together by computeFiguresFor (each batch is one set of statements). Measured on the large
 * fleet (bench --large, cold dashboard against its floor): 20–64 coils a batch all gave ×2.7–3.2; 100 gave ×5.6–6.1,
 * its rows outliving the young generation again. 32 keeps well clear of that edge.
 */
const FIGURES_BATCH_COILS = 32;

/**
 * Every listed coil's figures at `now`: stored ones where still current, the rest recomputed and stored.
 * The revisions are read before any logbook row, which is what makes the conditional store safe.
 */
export async function getCoilFigures(scope: SiteScope, coilIds: readonly string[], policy: PolicyVersion, now: Date): Promise<Map<string, CoilFigures>> {
  // Raw, straight through the adapter (lib/db/adapter-read.ts says why); the site's coils only, so a listed coil of
  // another site is simply not found.
  const rows = await readRows<CoilSummary>(Prisma.sql`
    SELECT s.* FROM "CoilSummary" s JOIN "Coil" ON "Coil".id = s."coilId" WHERE "Coil"."siteId" = ${scope.siteId}`);
  const rowByCoil = new Map(rows.map((row) => [row.coilId, row]));
  const figures = new Map<string, CoilFigures>();
  const stale: string[] = [];
  for (const coilId of coilIds) {
    const row = rowByCoil.get(coilId);
    const current = row ? readCurrentFigures(row, policy.version, now) : null;
    if (current) figures.set(coilId, current);
    else stale.push(coilId);
  }
  if (stale.length === 0) return figures;
  // A coil without a row is either new at this site or another site's: only the first gets one (the statement joins
  // the coil at the site), and only the site's coils come back from the history read.
  await createMissingSummaries(
    scope,
    stale.filter((coilId) => !rowByCoil.has(coilId)),
  );
  const revisions = new Map(stale.map((coilId) => [coilId, rowByCoil.get(coilId)?.revision ?? 0]));
  const computed = await computeFiguresFor(scope, stale, revisions, policy, now);
  await storeCoilFigures(scope, computed, policy.version, now);
  for (const c of computed) figures.set(c.coilId, c.figures);
  return figures;
}
