/** Run sessions: reads and writes. */
import { prisma, type Tx } from "./client";
import { serializableTransaction } from "./serializable";
import { findCurrentTopLoadId } from "../analysis/current-top-load";
import { normalizePage, toPage, type PageRequest } from "./pagination";
import type { Prisma, RunSession } from "./generated/client";
import { textContains } from "./text-search";
import { recordAudit } from "./audit";
import { markCoilChanged } from "./coil-summary";
import { RecordRefusedError } from "./record-refused";
import type { SessionInput } from "../validation/session";
import { fitSessionSamples } from "../analysis/session-fit";
import { coilOfSite, recordOfSite, type SiteScope } from "./site-scope";

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
 * with the same key returns the session already stored, with `replayed: true`, and writes nothing. The key is
 * looked up inside the transaction, which then runs at Serializable isolation (serializable.ts): of two
 * submits racing with one key, the unique index on RunSession.clientKey (or the isolation) refuses the
 * second's insert, its transaction rolls back whole (no samples, summary bump or audit event) and runs again,
 * and this time its look-up finds the winner's session. Without a key nothing is looked up, as before.
 *
 * The coil must be the scope's site's (another site's coil is refused as one that does not exist), the session is
 * logged by scope.actorId, and only a session the same member logged at the same site is ever replayed.
 */
export async function createSession(scope: SiteScope, input: SessionInput): Promise<StoredSession> {
  const { clientKey } = input;
  if (!clientKey) return prisma.$transaction((tx) => insertSession(tx, scope, input));
  return serializableTransaction(async (tx) => (await findSessionByClientKey(tx, scope, clientKey)) ?? insertSession(tx, scope, input));
}

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

async function insertSession(tx: Tx, scope: SiteScope, input: SessionInput): Promise<StoredSession> {
  const coil = await tx.coil.findFirst({ where: { id: input.coilId, ...coilOfSite(scope) }, select: { id: true, tag: true, siteId: true } });
  if (!coil) throw new RecordRefusedError("coilId", "Coil: that coil does not exist.");
  if (input.topLoadId) {
    const topLoad = await tx.topLoad.findUnique({ where: { id: input.topLoadId }, select: { coilId: true } });
    if (!topLoad || topLoad.coilId !== coil.id) throw new RecordRefusedError("topLoadId", `Top load: choose one of ${coil.tag}'s top loads.`);
  }
  const loan = await tx.loan.findFirst({
    where: { coilId: coil.id, outAt: { lte: input.startedAt }, OR: [{ returnedAt: null }, { returnedAt: { gt: input.startedAt } }] },
    select: { id: true },
  });
  const { samples, ...fields } = input;
  const session = await tx.runSession.create({
    data: {
      ...fields,
      topLoadId: fields.topLoadId ?? null,
      loggedById: scope.actorId,
      loanId: loan?.id ?? null,
      // The warm-up fit goes in with its samples, so every view judges the session from the same steady state.
      ...fitSessionSamples(samples),
      samples: { create: samples.map((s) => ({ elapsedS: s.elapsedS, temperatureC: s.temperatureC })) },
    },
  });
  await markCoilChanged(tx, coil.id);
  await recordAudit(tx, {
    siteId: coil.siteId,
    actorId: scope.actorId,
    action: "create",
    entity: "RunSession",
    entityId: session.id,
    summary: `Logged a ${Math.round(input.durationS / 60)} min session on ${coil.tag} at ${input.supplyVoltageV} V with ${samples.length} heat-sink samples`,
    detail: { ...fields, sampleCount: samples.length },
  });
  return { ...session, coilTag: coil.tag, replayed: false };
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
