/** Run sessions: reads and writes. */
import { prisma, type Tx } from "./client";
import { findCurrentTopLoadId } from "../analysis/current-top-load";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import { Prisma, type RunSession } from "./generated/client";
import { textContains } from "./text-search";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { RecordRefusedError } from "./record-refused";
import type { SessionInput } from "../validation/session";
import { fitSessionSamples } from "../analysis/session-fit";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";
import { adapterErrorKind, inAdapterTransaction, isAdapterWriteConflict, newRecordId, type StatementRunner } from "./session-write";

export interface SessionListFilter {
  coilTag?: string;
  q?: string;
  outcome?: "normal" | "stopped" | "anomaly" | "failed";
  sort?: "newest" | "oldest" | "voltage" | "current" | "duration";
}

const ORDER: Record<NonNullable<SessionListFilter["sort"]>, Prisma.RunSessionOrderByWithRelationInput[]> = {
  newest: [{ startedAt: "desc" }, { id: "desc" }],
  oldest: [{ startedAt: "asc" }, { id: "asc" }],
  voltage: [{ supplyVoltageV: "desc" }, { startedAt: "desc" }],
  current: [{ supplyCurrentA: "desc" }, { startedAt: "desc" }],
  duration: [{ durationS: "desc" }, { startedAt: "desc" }],
};

/** The scope's site's sessions, a page at a time; the coil filter and the search look only inside that site. */
export async function listSessions(scope: SiteScope, filter: SessionListFilter = {}, pageRequest: Partial<PageRequest> = {}) {
  const request = normalizePage(pageRequest);
  const where: Prisma.RunSessionWhereInput = {
    outcome: filter.outcome,
    coil: { ...coilOfSite(scope), ...(filter.coilTag ? { tag: filter.coilTag } : {}) },
    ...(filter.q ? { OR: [{ notes: textContains(filter.q) }, { coil: { tag: textContains(filter.q) } }, { coil: { name: textContains(filter.q) } }] } : {}),
  };
  const [rows, total] = await Promise.all([
    prisma.runSession.findMany({
      where,
      orderBy: ORDER[filter.sort ?? "newest"],
      skip: (request.page - 1) * request.pageSize,
      take: request.pageSize,
      include: { coil: { select: { tag: true, name: true } }, loggedBy: { select: { name: true } }, topLoad: { select: { name: true } } },
    }),
    prisma.runSession.count({ where }),
  ]);
  return toPage(rows, total, request);
}

/**
 * The form's default: the coil's current top load by the one rule (lib/analysis/current-top-load.ts); null for a
 * coil of another site, as for one without top loads.
 */
export async function findLastTopLoadId(scope: SiteScope, coilId: string): Promise<string | null> {
  const ofCoil = { coilId, ...recordOfSite(scope) };
  const [session, sweep, topLoads] = await Promise.all([
    prisma.runSession.findFirst({ where: { ...ofCoil, topLoadId: { not: null } }, orderBy: { startedAt: "desc" }, select: { startedAt: true, topLoadId: true } }),
    prisma.sweep.findFirst({ where: ofCoil, orderBy: { takenAt: "desc" }, select: { takenAt: true, topLoadId: true } }),
    prisma.topLoad.findMany({ where: ofCoil, orderBy: [{ createdAt: "asc" }, { id: "asc" }], select: { id: true, retiredAt: true } }),
  ]);
  return findCurrentTopLoadId(sweep ? [sweep] : [], session ? [session] : [], topLoads);
}

/**
 * Stores one session and its heat-sink samples with an audit entry, all in one transaction. The top
 * load must belong to the coil; a session run while the coil was out on loan is linked to that loan.
 *
 * With a clientKey (the submission's idempotency key) the session is stored once: a replay or a double tap
 * with the same key returns the session already stored, with `replayed: true`, and writes nothing. The unique index
 * on RunSession.clientKey settles it: of two submits with one key, the second's insert is refused (on PostgreSQL it
 * waits for the first to commit), its transaction rolls back whole (no samples, summary bump or audit event), and
 * only then is the key looked up, finding the winner's session. Without a key nothing is looked up.
 *
 * The coil must be the scope's site's (another site's coil is refused as one that does not exist), the session is
 * logged by scope.actorId, and only a session the same member logged at the same site is ever replayed.
 * The statements run on the client's driver adapter (session-write.ts says why and how).
 */
export async function createSession(scope: SiteScope, input: SessionInput): Promise<StoredSession> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await inAdapterTransaction((runner) => insertSession(runner, scope, input));
    } catch (error) {
      const { kind } = adapterErrorKind(error);
      // The checks inside the INSERT leave "coilId" null when the coil or its top load is not the scope's.
      if (kind === "NullConstraintViolation") throw (await explainRefusal(scope, input)) ?? error;
      if (input.clientKey && kind === "UniqueConstraintViolation") {
        const stored = await findSessionByClientKey(prisma, scope, input.clientKey);
        if (stored) return stored;
        // The key's holder rolled back meanwhile: store this one after all.
      } else if (!isAdapterWriteConflict(error)) throw error;
      if (attempt >= WRITE_ATTEMPTS) throw error;
      const backoff = FIRST_BACKOFF_MS * 2 ** (attempt - 1);
      await new Promise((resolve) => setTimeout(resolve, backoff / 2 + Math.random() * backoff));
    }
  }
}

/** As serializable.ts: a few attempts, the back-off doubled each time with jitter so two writers do not collide in step. */
const WRITE_ATTEMPTS = 6;
const FIRST_BACKOFF_MS = 5;

export type StoredSession = RunSession & { coilTag: string; replayed: boolean };

/**
 * The session stored under `clientKey` by the same member at the same site, as createSession returns it. A key used
 * by anyone else, or at another site, is refused (the unique index would refuse the insert anyway) with the same
 * words either way and without reading that session: only whether the key is taken is asked.
 */
async function findSessionByClientKey(tx: Tx, scope: SiteScope, clientKey: string): Promise<StoredSession | null> {
  const session = await tx.runSession.findFirst({
    where: { clientKey, loggedById: scope.actorId, ...recordOfSite(scope) },
    include: { coil: { select: { tag: true } } },
  });
  if (session) {
    const { coil, ...fields } = session;
    return { ...fields, coilTag: coil.tag, replayed: true };
  }
  if ((await tx.runSession.count({ where: { clientKey } })) > 0) {
    throw new RecordRefusedError("clientKey", "Submission key: it was already used for another submission; send a new key.");
  }
  return null;
}

/** Why the INSERT found no coil: not one of the scope's site (or none at all), or a top load of another coil. */
async function explainRefusal(scope: SiteScope, input: SessionInput): Promise<RecordRefusedError | null> {
  const coil = await prisma.coil.findFirst({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { tag: true } });
  if (!coil) return new RecordRefusedError("coilId", "Coil: that coil does not exist.");
  if (input.topLoadId) {
    const topLoad = await prisma.topLoad.findUnique({ where: { id: input.topLoadId }, select: { coilId: true } });
    if (!topLoad || topLoad.coilId !== input.coilId) return new RecordRefusedError("topLoadId", `Top load: choose one of ${coil.tag}'s top loads.`);
  }
  return null;
}

/** Heat-sink samples per INSERT: three values a row, well under either database's limit on bound values. */
const SAMPLES_PER_INSERT = 1_000;

async function insertSession(runner: StatementRunner, scope: SiteScope, input: SessionInput): Promise<StoredSession> {
  const { samples, ...fields } = input;
  const session: RunSession = {
    id: newRecordId(),
    coilId: fields.coilId,
    topLoadId: fields.topLoadId ?? null,
    startedAt: fields.startedAt,
    loggedById: scope.actorId,
    supplyVoltageV: fields.supplyVoltageV,
    supplyCurrentA: fields.supplyCurrentA,
    durationS: fields.durationS,
    ambientTempC: fields.ambientTempC,
    heatSinkStartC: fields.heatSinkStartC ?? null,
    heatSinkEndC: fields.heatSinkEndC ?? null,
    runningFrequencyHz: fields.runningFrequencyHz ?? null,
    peakSwitchVoltageV: fields.peakSwitchVoltageV ?? null,
    dutyCycle: fields.dutyCycle ?? null,
    outcome: fields.outcome,
    notes: fields.notes,
    loanId: null,
    createdAt: new Date(),
    clientKey: fields.clientKey ?? null,
    // The warm-up fit goes in with its samples, so every view judges the session from the same steady state.
    ...fitSessionSamples(samples),
  };
  // The coil at the scope's site, and with a top load only if it is that coil's: null otherwise, which "coilId"'s
  // NOT NULL refuses (createSession then says which check failed).
  const coilOfScope = session.topLoadId
    ? Prisma.sql`(SELECT c.id FROM "Coil" c WHERE c.id = ${session.coilId} AND c."siteId" = ${scope.siteId}
        AND EXISTS (SELECT 1 FROM "TopLoad" t WHERE t.id = ${session.topLoadId} AND t."coilId" = c.id))`
    : Prisma.sql`(SELECT c.id FROM "Coil" c WHERE c.id = ${session.coilId} AND c."siteId" = ${scope.siteId})`;
  const openLoan = Prisma.sql`(SELECT l.id FROM "Loan" l WHERE l."coilId" = ${session.coilId} AND l."outAt" <= ${session.startedAt}
    AND (l."returnedAt" IS NULL OR l."returnedAt" > ${session.startedAt}) LIMIT 1)`;
  const [inserted] = await runner.query<{ loanId: string | null; coilTag: string }>(Prisma.sql`
    INSERT INTO "RunSession" (id, "coilId", "topLoadId", "startedAt", "loggedById", "supplyVoltageV", "supplyCurrentA", "durationS", "ambientTempC",
      "heatSinkStartC", "heatSinkEndC", "runningFrequencyHz", "peakSwitchVoltageV", "dutyCycle", outcome, notes, "loanId", "createdAt", "clientKey",
      "sinkFitSampleCount", "sinkSteadyStateC", "sinkSteadyStateSeK", "sinkTimeConstantS", "sinkFitExtrapolation", "sinkFitJson")
    VALUES (${session.id}, ${coilOfScope}, ${session.topLoadId}, ${session.startedAt}, ${session.loggedById}, ${session.supplyVoltageV},
      ${session.supplyCurrentA}, ${session.durationS}, ${session.ambientTempC}, ${session.heatSinkStartC}, ${session.heatSinkEndC},
      ${session.runningFrequencyHz}, ${session.peakSwitchVoltageV}, ${session.dutyCycle}, ${session.outcome}, ${session.notes}, ${openLoan},
      ${session.createdAt}, ${session.clientKey}, ${session.sinkFitSampleCount}, ${session.sinkSteadyStateC}, ${session.sinkSteadyStateSeK},
      ${session.sinkTimeConstantS}, ${session.sinkFitExtrapolation}, ${session.sinkFitJson})
    RETURNING "loanId", (SELECT tag FROM "Coil" WHERE "Coil".id = "RunSession"."coilId") AS "coilTag"`);
  if (!inserted) throw new Error("The session insert returned no row.");
  session.loanId = inserted.loanId;
  for (let start = 0; start < samples.length; start += SAMPLES_PER_INSERT) {
    const rows = samples.slice(start, start + SAMPLES_PER_INSERT).map((s) => Prisma.sql`(${session.id}, ${s.elapsedS}, ${s.temperatureC})`);
    await runner.execute(Prisma.sql`INSERT INTO "HeatSinkSample" ("sessionId", "elapsedS", "temperatureC") VALUES ${Prisma.join(rows)}`);
  }
  await markCoilChanged(runner, session.coilId);
  await recordAudit(runner, {
    siteId: scope.siteId,
    actorId: scope.actorId,
    action: "create",
    entity: "RunSession",
    entityId: session.id,
    summary: `Logged a ${Math.round(input.durationS / 60)} min session on ${inserted.coilTag} at ${input.supplyVoltageV} V with ${samples.length} heat-sink samples`,
    detail: { ...fields, sampleCount: samples.length },
  });
  return { ...session, coilTag: inserted.coilTag, replayed: false };
}

/**
 * One session of the scope's site with everything its page shows: the coil, its parts (for the parts fitted that
 * day), samples and failures; null when there is none there.
 */
export function getSessionDetail(scope: SiteScope, id: string) {
  return prisma.runSession.findFirst({
    where: { id, ...recordOfSite(scope) },
    include: {
      coil: { include: { components: { orderBy: { installedAt: "asc" } } } },
      topLoad: { select: { name: true } },
      loggedBy: { select: { name: true } },
      loan: { select: { borrower: true, event: true } },
      samples: { orderBy: { elapsedS: "asc" }, select: { elapsedS: true, temperatureC: true } },
      failures: { select: { id: true, mode: true, status: true, occurredAt: true } },
    },
  });
}

export type SessionDetail = NonNullable<Awaited<ReturnType<typeof getSessionDetail>>>;
